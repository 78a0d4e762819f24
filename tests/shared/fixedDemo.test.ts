import { describe, expect, it } from 'vitest';
import { readdirSync, readFileSync } from 'node:fs';
import { analyzeDesign, analyzeFixedSection, type AnalysisResult, type DesignInput } from '../../shared/control/index';
import { goldenVectors } from '../../shared/firmware/index';
import { referenceBlock } from './fixedReference';

// The demo designs of examples/ through the whole core: the fixed-point checks must tell the
// 16-bit port apart from the 32-bit units, and the golden vectors must match the formula.
const dir = new URL('../../examples/', import.meta.url);
const designs = readdirSync(dir).filter((f) => f.endsWith('.json')).sort().map((f) => [f, JSON.parse(readFileSync(new URL(f, dir), 'utf8')) as DesignInput] as const);
const fixedPointErrorIds = /-(quantization-drift|lost-coefficient|pole-at-one|quantized-unstable|integral-lost|coefficient-range)$/;
const analyses = new Map<string, AnalysisResult>(designs.map(([f, d]) => [f, analyzeDesign(d, { sweepPoints: 0, responseSamples: 0 })]));

describe('fixed point on the demo designs (examples/)', () => {
  it('has the three demo designs', () => {
    expect(designs.map(([f]) => f)).toEqual(expect.arrayContaining(['sc2-port-16bit-230v.json', 'sc3-bench-l-120v.json', 'sc5-field-lcl-240v.json']));
  });

  it('the 230 V 16-bit port shows the h1 resonance drift error with a remedy (REFERENCES: Q14 50 Hz at 20 kHz lands near 49.74 Hz)', () => {
    const analysis = analyses.get('sc2-port-16bit-230v.json')!;
    const drift = analysis.checks.find((c) => c.id === 'pr-h1-quantization-drift');
    expect(drift).toMatchObject({ severity: 'error', unit: 'Hz', blockId: 'current-pr' });
    expect(drift!.value!).toBeGreaterThan(0.2);
    expect(drift!.value!).toBeLessThan(0.3);
    expect(drift!.value!).toBeGreaterThan(drift!.limit!);
    expect(drift!.remedy).toMatch(/32-bit word/);
    const h1 = analysis.blocks.find((b) => b.id === 'current-pr')!.sections.find((s) => s.role === 'resonant-h1')!;
    expect(h1.fixed.qFormat).toBe('Q2.14');
  });

  it.each(designs.filter(([, d]) => d.fixedPoint.wordBits === 32).map(([f]) => [f]))('%s (32 bit) has no fixed-point error and resonances within 0.2 mHz', (file) => {
    const analysis = analyses.get(file)!;
    expect(analysis.checks.filter((c) => c.severity === 'error' && fixedPointErrorIds.test(c.id))).toEqual([]);
    const drifts = analysis.checks.filter((c) => c.id.endsWith('-quantization-drift'));
    expect(drifts.length).toBeGreaterThan(0);
    for (const c of drifts) expect(c.value!, c.id).toBeLessThan(2e-4);
  });

  it.each(designs.map(([f]) => [f]))('%s: sections carry the fixed analysis of their own integers; golden vectors match the BigInt formula', (file) => {
    const analysis = analyses.get(file)!;
    for (const block of analysis.blocks) {
      for (const s of block.sections) {
        // `fixed` is the quantization of `scaled` (CONTRACT section 7), so its analysis runs on the scaled doubles.
        expect(s.fixedAnalysis).toEqual(analyzeFixedSection({ ...s, b: s.scaled!.b }, s.fixed, analysis.sampleTimeS));
      }
    }
    const grid = designs.find(([f]) => f === file)![1].grid.frequencyHz;
    const vectors = goldenVectors(analysis, grid, { samples: 600, seed: 99 });
    expect(vectors).toHaveLength(3 * analysis.blocks.length);
    for (const v of vectors) {
      const block = analysis.blocks.find((b) => b.id === v.blockId)!;
      expect(v.expected, `${v.blockId}/${v.name}`).toEqual(referenceBlock(block.sections.map((s) => s.fixed), v.input, v.wordBits));
    }
  });
});
