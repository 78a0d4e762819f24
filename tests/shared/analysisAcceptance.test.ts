// Acceptance of analyzeDesign end to end, on designs not in examples/ with every gain given, against
// tests/fixtures/scipy/analysis.json written by generate_analysis.py (scipy 1.17.1, numpy): section
// coefficients by scipy.signal.bilinear at the prewarped rate, plant by scipy.signal.cont2discrete 'zoh',
// margins from a dense numpy sweep refined with brentq, poles by numpy.linalg.eigvals of a parallel-section
// state space. Tolerances of the acceptance: coefficients 1e-9 relative, PM ±1°, GM ±0.3 dB, Ms ±2 %,
// max pole radius ±2e-5.
import { describe, it, expect } from 'vitest';
import { readFileSync } from 'node:fs';
import { atReferenceSamples, expectClose } from '../helpers/expectClose';
import { analyzeDesign } from '../../shared/control/analyze';
import type { DesignInput, LoopId } from '../../shared/control/types';

interface RefLoop {
  crossoverHz: number | null;
  phaseMarginDeg: number | null;
  gainMarginDb: number | null;
  peakSensitivity: number;
  maxPoleRadius: number;
  stable: boolean;
  poles: [number, number][];
}
interface RefCase {
  design: DesignInput;
  sampleTimeS: number;
  timeSamples: number;
  openLoop: Record<LoopId, { frequencyHz: number[]; magnitudeDb: number[]; phaseDegWrapped: number[] }>;
  time: Record<'current-step' | 'pll-phase-step' | 'dc-link-load-step', number[]>;
  sections: Record<string, { b: number[]; a: number[]; gain: number; scaledB: number[]; fixed: { fracBits: number; b: number[]; a: number[] } }[]>;
  loops: Record<LoopId, RefLoop>;
}
const fixture = JSON.parse(readFileSync(new URL('../fixtures/scipy/analysis.json', import.meta.url), 'utf8')) as { generator: string; cases: RefCase[] };

const cases = fixture.cases.map((c) => [c.design.name, c] as const);
const loopIds: LoopId[] = ['current', 'voltage', 'pll'];

describe(`analyzeDesign against ${fixture.generator}`, () => {
  it.each(cases)('%s: every section matches scipy to 1e-9 relative', (_name, ref) => {
    const result = analyzeDesign(ref.design, { sweepPoints: 0, responseSamples: 0 });
    expectClose(result.sampleTimeS, ref.sampleTimeS, { rtol: 1e-15 }, 'Ts');
    for (const [blockId, sections] of Object.entries(ref.sections)) {
      const block = result.blocks.find((b) => b.id === blockId);
      expect(block, blockId).toBeDefined();
      expect(block?.sections.length, `${blockId} sections`).toBe(sections.length);
      sections.forEach((want, i) => {
        const got = block?.sections[i];
        const scale = Math.max(...want.b.map(Math.abs), ...want.a.map(Math.abs));
        expectClose(got?.b ?? [], want.b, { rtol: 1e-9, atol: 1e-15 * scale }, `${blockId}[${i}].b`);
        expectClose(got?.a ?? [], want.a, { rtol: 1e-9, atol: 1e-15 * scale }, `${blockId}[${i}].a`);
      });
    }
  });

  // CONTRACT section 7: g from the per-unit bases, scaled = g * b, and `fixed` the quantization of
  // `scaled` with the F rule; the generator computes g from the contract formula and quantizes in
  // exact rational arithmetic.
  it.each(cases)('%s: scaled numerators and their integers match the reference', (_name, ref) => {
    const result = analyzeDesign(ref.design, { sweepPoints: 0, responseSamples: 0 });
    for (const [blockId, sections] of Object.entries(ref.sections)) {
      const block = result.blocks.find((b) => b.id === blockId)!;
      sections.forEach((want, i) => {
        const got = block.sections[i];
        expectClose(got.scaled?.gain ?? NaN, want.gain, { rtol: 1e-15 }, `${blockId}[${i}] g`);
        expect(got.scaled?.units).toBe(ref.design.signals?.units ?? 'per-unit');
        const scale = Math.max(...want.scaledB.map(Math.abs));
        expectClose(got.scaled?.b ?? [], want.scaledB, { rtol: 1e-9, atol: 1e-15 * scale }, `${blockId}[${i}] g*b`);
        expect(got.scaled?.a).toEqual(got.a);
        expect({ fracBits: got.fixed.fracBits, b: got.fixed.b, a: got.fixed.a }, `${blockId}[${i}] integers`).toEqual(want.fixed);
      });
    }
  });

  it.each(cases)('%s: margins, peak sensitivity and poles of the three loops', (_name, ref) => {
    const result = analyzeDesign(ref.design, { sweepPoints: 0, responseSamples: 0 });
    for (const id of loopIds) {
      const want = ref.loops[id];
      const got = result.loops.find((l) => l.id === id);
      expect(got, id).toBeDefined();
      if (!got) continue;
      expect(got.stable, `${id} stable`).toBe(want.stable);
      expect(got.phaseMarginDeg === null, `${id} PM null`).toBe(want.phaseMarginDeg === null);
      if (want.phaseMarginDeg !== null) expectClose(got.phaseMarginDeg ?? NaN, want.phaseMarginDeg, { atol: 1 }, `${id} PM`);
      expect(got.gainMarginDb === null, `${id} GM null (got ${got.gainMarginDb})`).toBe(want.gainMarginDb === null);
      if (want.gainMarginDb !== null) expectClose(got.gainMarginDb ?? NaN, want.gainMarginDb, { atol: 0.3 }, `${id} GM`);
      if (want.crossoverHz !== null) expectClose(got.crossoverHz ?? NaN, want.crossoverHz, { rtol: 5e-3 }, `${id} crossover`);
      expectClose(got.peakSensitivity, want.peakSensitivity, { rtol: 0.02 }, `${id} Ms`);
      expectClose(got.maxPoleRadius, want.maxPoleRadius, { atol: 2e-5 }, `${id} max pole radius`);
      // Every non-trivial reference pole has a computed pole within 2e-5.
      for (const [re, im] of want.poles) {
        const nearest = Math.min(...got.closedLoopPoles.map(([r, i]) => Math.hypot(r - re, i - im)));
        expect(nearest, `${id} pole ${re}${im >= 0 ? '+' : ''}${im}j`).toBeLessThan(2e-5);
      }
    }
  });

  // Step responses against scipy.signal.dlsim of the same closed loops (fixture header names the version).
  it.each(cases)('%s: current, PLL and DC-link step responses match scipy.signal.dlsim', (_name, ref) => {
    const result = analyzeDesign(ref.design, { sweepPoints: 50, responseSamples: ref.timeSamples });
    for (const key of ['current-step', 'pll-phase-step', 'dc-link-load-step'] as const) {
      const got = result.responses?.time[key];
      const want = ref.time[key];
      expect(got, key).toBeDefined();
      const scale = Math.max(...want.map(Math.abs));
      expect(got?.value.length).toBe(ref.timeSamples);
      // Slow loops are recorded over a longer horizon (every stride-th sample): compare where both exist.
      const paired = atReferenceSamples(got ?? { timeS: [], value: [] }, want, ref.sampleTimeS);
      expectClose(paired.got, paired.want, { atol: 1e-9 * scale }, key);
      if (key === 'current-step') expectClose(got?.timeS ?? [], want.map((_, i) => i * ref.sampleTimeS), { rtol: 1e-12, atol: 1e-15 }, `${key} time`);
    }
  });

  // Open-loop sweeps on the plot grid against the same loops evaluated by numpy on np.geomspace.
  it.each(cases)('%s: open-loop Bode data of the three loops match numpy', (_name, ref) => {
    const points = ref.openLoop.current.frequencyHz.length;
    const result = analyzeDesign(ref.design, { sweepPoints: points, responseSamples: 10 });
    for (const id of loopIds) {
      const got = result.responses?.openLoop[id];
      const want = ref.openLoop[id];
      expect(got, id).toBeDefined();
      expectClose(got?.frequencyHz ?? [], want.frequencyHz, { rtol: 1e-12 }, `${id} f`);
      expectClose(got?.magnitudeDb ?? [], want.magnitudeDb, { atol: 1e-7 }, `${id} |L| dB`);
      // The plot phase is unwrapped: equal to numpy's wrapped phase modulo 360 degrees.
      const wrapDiff = (got?.phaseDeg ?? []).map((p, i) => { const d = (((p - want.phaseDegWrapped[i]) % 360) + 540) % 360 - 180; return d; });
      expectClose(wrapDiff, want.phaseDegWrapped.map(() => 0), { atol: 1e-7 }, `${id} phase mod 360`);
      const steps = (got?.phaseDeg ?? []).slice(1).map((p, i) => Math.abs(p - (got?.phaseDeg ?? [])[i]));
      expect(Math.max(...steps), `${id} unwrapped`).toBeLessThan(180);
    }
  });
});
