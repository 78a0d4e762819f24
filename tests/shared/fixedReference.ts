import type { AnalysisResult, FixedCoefficients, SectionKind } from '../../shared/control/types';
import { quantizeSection } from '../../shared/control/quantize';
import { readFileSync } from 'node:fs';

/**
 * Test-local reference of the CONTRACT section 3 arithmetic, written from the formula with BigInt
 * (no code shared with the model): y = sat_W((sum bq_i x[n-i] - sum aq_i y[n-i] + 2^(F-1)) >> F),
 * BigInt >> being a floor shift like an arithmetic shift, symmetric saturation.
 */
export function referenceDf1(fixed: FixedCoefficients, input: readonly number[]): number[] {
  const max = BigInt(2 ** (fixed.wordBits - 1) - 1);
  const [b0, b1, b2] = fixed.b.map(BigInt);
  const [, a1, a2] = fixed.a.map(BigInt);
  const f = BigInt(fixed.fracBits);
  const rc = fixed.fracBits > 0 ? 1n << (f - 1n) : 0n;
  let x1 = 0n, x2 = 0n, y1 = 0n, y2 = 0n;
  return input.map((value) => {
    const x = BigInt(value);
    let y = (b0 * x + b1 * x1 + b2 * x2 - a1 * y1 - a2 * y2 + rc) >> f;
    y = y > max ? max : y < -max ? -max : y;
    x2 = x1; x1 = x; y2 = y1; y1 = y;
    return Number(y);
  });
}

/** Block reference: sat_W of the sum of the saturated section outputs. */
export function referenceBlock(sections: readonly FixedCoefficients[], input: readonly number[], wordBits: number): number[] {
  const max = 2 ** (wordBits - 1) - 1;
  const outs = sections.map((s) => referenceDf1(s, input));
  return input.map((_, n) => Math.max(-max, Math.min(max, outs.reduce((sum, o) => sum + o[n], 0))));
}

interface FixtureCase { name: string; kind: SectionKind; role: string; wordBits: number; designHz: number | null; b: number[]; a: number[] }
const fixtureCases = (JSON.parse(readFileSync(new URL('../fixtures/scipy/fixed_sections.json', import.meta.url), 'utf8')) as { cases: FixtureCase[] }).cases;

/**
 * An analysis-shaped object of six blocks built from the scipy fixture sections (60 Hz at 32 kHz
 * resonators, PI, SOGI at its own rate, Butterworth), quantized to `wordBits`.
 */
export function fixtureAnalysis(wordBits: 16 | 32): AnalysisResult {
  const section = (prefix: string) => {
    const c = fixtureCases.find((k) => k.name.startsWith(prefix) && k.wordBits === wordBits);
    if (!c) throw new Error(`missing fixture ${prefix}`);
    return { role: c.role, kind: c.kind, prewarpHz: c.designHz, b: c.b, a: c.a, fixed: quantizeSection(c.b, c.a, wordBits) };
  };
  return {
    format: 'varsmith-analysis/1', sampleTimeS: 1 / 32000, loops: [], plant: {}, checks: [],
    blocks: [
      { id: 'voltage-pi', method: 'tustin', gains: {}, sections: [section('PI kp = 0.8')] },
      { id: 'pll-pi', method: 'tustin', gains: {}, sections: [section('PI kp = 153')] },
      { id: 'current-pr', method: 'tustin-prewarp', gains: {}, sections: ['proportional', 'damped resonator h1', 'damped resonator h3', 'damped resonator h5', 'damped resonator h7'].map(section) },
      { id: 'sogi-d', method: 'tustin-prewarp', gains: {}, sections: [section('SOGI D')] },
      { id: 'sogi-q', method: 'tustin-prewarp', gains: {}, sections: [section('SOGI Q')] },
      { id: 'reactive-lpf', method: 'tustin-prewarp', gains: {}, sections: [section(wordBits === 32 ? 'Butterworth' : 'first-order low-pass')] },
    ],
  };
}
