// The whole pipeline on the demo designs and on random valid designs (fast-check properties).
import { describe, it, expect } from 'vitest';
import fc from 'fast-check';
import { readFileSync, readdirSync } from 'node:fs';
import { analyzeDesign } from '../../shared/control';
import { parseDesign } from '../../shared/api/design';
import type { DesignInput } from '../../shared/control/types';
import { expectClose } from '../helpers/expectClose';

const examplesDir = new URL('../../examples/', import.meta.url);
const load = (file: string) => JSON.parse(readFileSync(new URL(file, examplesDir), 'utf8')) as DesignInput;
const demos = readdirSync(examplesDir).filter((f) => f.endsWith('.json'));
const NONE = { sweepPoints: 0, responseSamples: 0 };

describe('demo designs', () => {
  it.each(demos)('%s: stable loops, contract shape, survives JSON', (file) => {
    const design = load(file);
    const r = analyzeDesign(design, NONE);
    expect(r.format).toBe('varsmith-analysis/1');
    expect(r.blocks.map((b) => b.id)).toEqual(['voltage-pi', 'pll-pi', 'current-pr', 'sogi-d', 'sogi-q', 'reactive-lpf']);
    expect(r.loops.map((l) => l.id)).toEqual(['current', 'voltage', 'pll']);
    for (const loop of r.loops) expect(loop.stable, `${loop.id} radius ${loop.maxPoleRadius}`).toBe(true);
    const stabilityErrors = r.checks.filter((c) => c.severity === 'error' && c.id.startsWith('loop-'));
    expect(stabilityErrors).toEqual([]);
    for (const block of r.blocks) for (const s of block.sections) { expect(s.b).toHaveLength(3); expect(s.a).toHaveLength(3); expect(s.a[0]).toBe(1); }
    expect(JSON.parse(JSON.stringify(r))).toEqual(r);
  });
  it('the 32-bit demos carry no error check at all', () => {
    for (const file of demos) {
      const design = load(file);
      if (design.fixedPoint.wordBits !== 32) continue;
      const errors = analyzeDesign(design, NONE).checks.filter((c) => c.severity === 'error');
      expect(errors, file).toEqual([]);
    }
  });
  it('the 16-bit port shows the resonance drift error with a remedy', () => {
    const r = analyzeDesign(load('sc2-port-16bit-230v.json'), NONE);
    const drift = r.checks.filter((c) => c.severity === 'error' && /drift/.test(c.id));
    expect(drift.length).toBeGreaterThan(0);
    expect(drift[0].remedy ?? '').not.toBe('');
  });
  it('plot data is optional and does not change any other number', () => {
    const design = load('sc5-field-lcl-240v.json');
    const bare = analyzeDesign(design, NONE);
    const full = analyzeDesign(design, { sweepPoints: 300, responseSamples: 300 });
    expect(full.responses?.openLoop.current.frequencyHz.length).toBe(300);
    expect(Object.keys(full.responses?.time ?? {}).sort()).toEqual(['current-step', 'dc-link-load-step', 'estimator-step', 'pll-phase-step']);
    const { responses: _r, ...rest } = full;
    expect(rest).toEqual(bare);
    expect(JSON.parse(JSON.stringify(full))).toEqual(full);
  });
});

// Random valid designs (ranges a firmware team would type).
const designArb = fc
  .record({
    f0: fc.constantFrom(50, 60),
    v: fc.double({ min: 100, max: 250, noNaN: true }),
    s: fc.double({ min: 500, max: 10000, noNaN: true }),
    fsw: fc.integer({ min: 8000, max: 40000 }),
    upc: fc.constantFrom(1, 2),
    lcl: fc.boolean(),
    harmonics: fc.uniqueArray(fc.constantFrom(1, 3, 5, 7, 9, 11), { minLength: 1, maxLength: 5 }),
    bw: fc.constantFrom(0, 0.5, 1, 2),
    word: fc.constantFrom(16 as const, 32 as const),
    order: fc.constantFrom(1 as const, 2 as const),
  })
  .map(({ f0, v, s, fsw, upc, lcl, harmonics, bw, word, order }) => {
    const i = s / v;
    const l = (0.04 * v) / (2 * Math.PI * f0 * i);
    const fs = fsw * upc;
    const filter = lcl
      ? { topology: 'LCL' as const, inverterInductanceH: (2 * l) / 3, gridInductanceH: l / 3, capacitanceF: 0.02 * s / (2 * Math.PI * f0 * v * v), dampingResistanceOhm: 2, resistanceOhm: 0.05 }
      : { topology: 'L' as const, inductanceH: l, resistanceOhm: 0.05 };
    const d: DesignInput = {
      format: 'varsmith-design/1', name: 'property case', grid: { voltageRmsV: v, frequencyHz: f0 }, rating: { apparentPowerVA: s }, filter,
      dcLink: { capacitanceF: 0.002, voltageRefV: 2 * v }, sampling: { switchingFrequencyHz: fsw, updatesPerCarrier: upc, computationDelaySamples: 1 },
      currentLoop: { crossoverHz: fs / 20, harmonics: harmonics.sort((a, b) => a - b), resonantBandwidthHz: bw, kp: null, resonantGains: null },
      voltageLoop: { crossoverHz: 10, phaseMarginDeg: 60, kp: null, ki: null },
      pll: { sogiGain: Math.SQRT2, settlingTimeS: 0.06, dampingRatio: 0.7071, kp: null, ki: null },
      reactiveFilter: { order, cutoffHz: 10 }, fixedPoint: { wordBits: word },
    };
    return d;
  });

describe('properties over random valid designs', () => {
  it('prewarped resonance exact; integers within the word; F maximal; JSON round-trip', () => {
    fc.assert(
      fc.property(designArb, (design) => {
        expect(parseDesign(design).ok).toBe(true);
        const r = analyzeDesign(design, NONE);
        const limit = 2 ** (design.fixedPoint.wordBits - 1) - 1;
        for (const block of r.blocks) {
          for (const s of block.sections) {
            if (s.resonanceHz && s.resonanceHz.discrete !== null) expectClose(s.resonanceHz.discrete, s.resonanceHz.design, { rtol: 1e-7 }, `${block.id}/${s.role}`);
            const ints = [...s.fixed.b, ...s.fixed.a];
            for (const n of ints) expect(Math.abs(n)).toBeLessThanOrEqual(limit);
            // CONTRACT section 7: `fixed` quantizes `scaled` (numerator times g, denominator unchanged).
            expect(s.scaled?.a).toEqual(s.a);
            const coeffs = [...(s.scaled?.b ?? []), ...s.a];
            const overflowsAtNext = coeffs.some((c) => Math.abs(Math.round(Math.abs(c) * 2 ** (s.fixed.fracBits + 1))) > limit);
            expect(s.fixed.fracBits === 62 || overflowsAtNext).toBe(true);
          }
        }
        expect(JSON.parse(JSON.stringify(r))).toEqual(r);
      }),
      { numRuns: 40, seed: 20261201 },
    );
  });
});
