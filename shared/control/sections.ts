/**
 * Stage "sections" of the analysis: the six controller blocks as double-precision second-order
 * sections (CONTRACT sections 2 and 3), in SI units, before any scaling or quantization.
 */
import { lowPassPrewarped, piTustin, resonatorPrewarped, sogiPrewarped, type SectionPair } from './blocks';
import type { DeltaTaps } from './deltaOperator';
import type { DesignedGains } from './designRules';
import { resonanceByMethodHz } from './discretize';
import { resonanceHzFromDenominator } from './resonance';
import type { BlockResult, DesignInput, SectionResult } from './types';

/** The reactive estimate is twice the low-passed product of current and quadrature template (sin^2 averages to 1/2). */
export const REACTIVE_ESTIMATE_FACTOR = 2;

/** A section before scaling and quantization, with its delta-operator form when it has one. */
export type DoubleSection = Omit<SectionResult, 'fixed' | 'scaled' | 'structure' | 'delta' | 'float32' | 'fixedAnalysis'> & {
  /** [b0, d1, d2, c1, c2] in SI (resonators, SOGI, low-passes); null for gains and PI. */
  deltaTaps: DeltaTaps | null;
};

/** A block of double sections. */
export type DoubleBlock = Omit<BlockResult, 'sections'> & { sections: DoubleSection[] };

/** Output of {@link designSections}: the blocks, and the SI pairs the loop and plant stages use. */
export interface DesignSections {
  blocks: DoubleBlock[];
  pairs: { current: SectionPair[]; voltage: SectionPair; pll: SectionPair; lpf: SectionPair };
}

function section(role: string, kind: SectionResult['kind'], pair: SectionPair, prewarpHz: number | null, samplePeriodS: number, designHz: number | null): DoubleSection {
  const s: DoubleSection = { role, kind, prewarpHz, b: [...pair.b], a: [...pair.a], deltaTaps: pair.delta ?? null };
  if (designHz !== null) s.resonanceHz = { design: designHz, discrete: resonanceHzFromDenominator(pair.a, samplePeriodS), fixed: null };
  return s;
}

/**
 * The six blocks of a design as double sections, in CONTRACT order: PI by Tustin; resonators,
 * SOGI and the low-pass by Tustin prewarped at their own frequency (see blocks.ts for the forms).
 *
 * @param design - a validated design.
 * @param gains - the gains in use (designRules).
 * @param samplePeriodS - Ts in seconds.
 * @returns the blocks (SI coefficients; `resonanceHz.fixed` still null) and the SI pairs.
 * @example
 * designSections(design, designGains(design), 5e-5).blocks.map((b) => b.id);
 * // => ['voltage-pi', 'pll-pi', 'current-pr', 'sogi-d', 'sogi-q', 'reactive-lpf']
 */
export function designSections(design: DesignInput, gains: DesignedGains, samplePeriodS: number): DesignSections {
  const f0 = design.grid.frequencyHz;
  const w0 = 2 * Math.PI * f0;
  const wb = 2 * Math.PI * design.currentLoop.resonantBandwidthHz;
  const voltage = piTustin(gains.voltageKp, gains.voltageKi, samplePeriodS);
  const pll = piTustin(gains.pllKp, gains.pllKi, samplePeriodS);
  const proportional: SectionPair = { b: [gains.currentKp, 0, 0], a: [1, 0, 0] };
  const harmonics = design.currentLoop.harmonics;
  const resonators = harmonics.map((h, i) => resonatorPrewarped(gains.resonantGains[i], h * w0, wb, samplePeriodS));
  const sogi = sogiPrewarped(design.pll.sogiGain, w0, samplePeriodS);
  const lpf = lowPassPrewarped(design.reactiveFilter.order, 2 * Math.PI * design.reactiveFilter.cutoffHz, samplePeriodS);
  const src = gains.sources;
  const currentSections = [
    section('proportional', 'gain', proportional, null, samplePeriodS, null),
    ...harmonics.map((h, i) => ({
      ...section(`resonant-h${h}`, 'resonator', resonators[i], h * f0, samplePeriodS, h * f0),
      resonanceByMethodHz: resonanceByMethodHz(h * w0, wb, samplePeriodS),
    })),
  ];
  const cutoffHz = design.reactiveFilter.cutoffHz;
  const blocks: DoubleBlock[] = [
    {
      id: 'voltage-pi', method: 'tustin',
      gains: { kp: gains.voltageKp, ki: gains.voltageKi, plantGain: gains.voltagePlantGain },
      gainSource: { kp: src.voltageKp, ki: src.voltageKi },
      sections: [section('pi', 'pi', voltage, null, samplePeriodS, null)],
    },
    {
      id: 'pll-pi', method: 'tustin',
      gains: { kp: gains.pllKp, ki: gains.pllKi, naturalFrequencyRadPerS: gains.pllNaturalRadPerS },
      gainSource: { kp: src.pllKp, ki: src.pllKi },
      sections: [section('pi', 'pi', pll, null, samplePeriodS, null)],
    },
    {
      id: 'current-pr', method: 'tustin-prewarp',
      gains: { kp: gains.currentKp, resonantGains: gains.resonantGains },
      gainSource: { kp: src.currentKp, resonantGains: src.resonantGains },
      sections: currentSections,
    },
    {
      id: 'sogi-d', method: 'tustin-prewarp', gains: { k: design.pll.sogiGain }, gainSource: { k: 'override' },
      sections: [section('band-pass', 'sogi-band-pass', sogi.d, f0, samplePeriodS, f0)],
    },
    {
      id: 'sogi-q', method: 'tustin-prewarp', gains: { k: design.pll.sogiGain }, gainSource: { k: 'override' },
      sections: [section('low-pass', 'sogi-low-pass', sogi.q, f0, samplePeriodS, f0)],
    },
    {
      id: 'reactive-lpf', method: 'tustin-prewarp',
      gains: { cutoffHz, order: design.reactiveFilter.order, reactiveEstimateFactor: REACTIVE_ESTIMATE_FACTOR },
      sections: [section('low-pass', 'low-pass', lpf, cutoffHz, samplePeriodS, null)],
    },
  ];
  return { blocks, pairs: { current: [proportional, ...resonators], voltage, pll, lpf } };
}
