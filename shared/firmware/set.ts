/**
 * The exported set as the firmware runs it: every block's sections in the arithmetic and form of
 * the design, the limited PI gains, the limits and the signal word — everything a per-sample
 * step needs, derived once from a design and its analysis (the export and the golden vectors use
 * it; the whole-controller step builds on it).
 */
import {
  perUnitBases, quantizeValue, resolveSignals,
  type AnalysisResult, type BlockId, type DesignInput, type SectionResult, type SignalUnits,
} from '../control/index';
import { signalMax } from './fixedModel';
import { quantizePiTaps, type PiTaps } from './limits';
import type { SectionSpec } from './sections';

/** One block of the set. */
export interface FirmwareBlock {
  id: BlockId;
  sections: SectionSpec[];
}

/** A limit in per unit (SI when the design's units are SI) and in the signal word. */
export interface FirmwareLimit {
  /** The limit in the block output's unit (pu, or A, V, rad/s in SI). */
  value: number;
  /** The limit as the firmware holds it: an integer in signal LSB (fixed) or a binary32 value. */
  word: number;
}

/** The set, ready to run. */
export interface FirmwareSet {
  arithmetic: 'fixed' | 'float32';
  units: SignalUnits;
  /** W of signals and coefficients (32 for float32). */
  wordBits: number;
  /** Fraction bits of the signal words (fixed); kept for float32 sets. */
  signalFracBits: number;
  /** Largest signal: 2^(W-1) - 1 (fixed) or FLT_MAX (float32). */
  signalMax: number;
  /** The number the signal word holds for 1 pu of a block's input, by block id (1 per unit; the base in SI). */
  inputOnePu: Record<BlockId, number>;
  /** The same for each block's output. */
  outputOnePu: Record<BlockId, number>;
  blocks: FirmwareBlock[];
  /** Limited PI gains of the DC-link and PLL loops. */
  pi: { 'voltage-pi': PiTaps; 'pll-pi': PiTaps };
  /**
   * Clamps: `currentReference` on the DC-link PI output (current amplitude), `pllFrequency` on the
   * PLL PI output (frequency deviation), `modulation` on the PR output (converter voltage over the
   * DC-link base, i.e. the modulation index at nominal DC-link voltage).
   */
  limits: { currentReference: FirmwareLimit; pllFrequency: FirmwareLimit; modulation: FirmwareLimit };
}

/**
 * The section spec of an analysed section in the set's arithmetic: float32 sections take the
 * binary32 coefficients of their form; fixed sections the delta integers when the section runs in
 * the delta-operator form, else the Direct Form I integers (`fixed`).
 *
 * @param section - an analysed section.
 * @param arithmetic - the set's arithmetic.
 * @returns the spec.
 * @example
 * sectionSpec(section, 'fixed').form; // => 'direct-form-1'
 */
export function sectionSpec(section: SectionResult, arithmetic: 'fixed' | 'float32'): SectionSpec {
  if (arithmetic === 'float32') {
    if (!section.float32) throw new RangeError(`section ${section.role} has no float32 coefficients: analyse the design with float32 arithmetic`);
    return { arithmetic, form: section.float32.form, coefficients: section.float32.coefficients };
  }
  if (section.delta) return { arithmetic, form: 'delta-operator', fixed: section.delta.fixed };
  return { arithmetic, form: 'direct-form-1', fixed: section.fixed };
}

/**
 * Builds the set of a design from its analysis (same design, same analysis).
 *
 * Limits: current reference = limits.currentReferencePeakA / Ibase (pu) or A; PLL = 2 pi
 * limits.pllFrequencyDeviationHz / wBase (pu) or rad/s; modulation = limits.modulationIndexMax (pu
 * of the DC-link base) or modulationIndexMax * VdcBase V. In the signal word: round half away
 * from zero of value * 2^F, clamped to the word (fixed), or the nearest binary32 (float32).
 * PI gains: kp = g kp, kh = g ki Ts / 2 from the block's gains and g (`scaled.gain`).
 *
 * @param design - the validated design.
 * @param analysis - its analysis result.
 * @returns the set.
 * @example
 * firmwareSet(sc3, analysis).limits.currentReference.value; // => 1.2
 */
export function firmwareSet(design: DesignInput, analysis: AnalysisResult): FirmwareSet {
  const r = resolveSignals(design);
  const b = perUnitBases(design);
  const perUnit = r.units === 'per-unit';
  const arithmetic = r.arithmetic;
  const wordBits = arithmetic === 'float32' ? 32 : design.fixedPoint.wordBits;
  const max = arithmetic === 'float32' ? 3.4028234663852886e38 : signalMax(wordBits);
  const word = (value: number): number => (arithmetic === 'float32'
    ? Math.fround(value)
    : quantizeValue(value, { wordBits, fracBits: r.signalFracBits, signed: true }, 'nearest-away', 'saturate').code);
  const limit = (value: number): FirmwareLimit => {
    const w = word(value);
    return { value, word: arithmetic === 'fixed' ? Math.min(Math.abs(w), max) : w };
  };
  const block = (id: BlockId) => {
    const found = analysis.blocks.find((x) => x.id === id);
    if (!found) throw new RangeError(`the analysis has no block ${id}`);
    return found;
  };
  const piTaps = (id: 'voltage-pi' | 'pll-pi'): PiTaps => {
    const x = block(id);
    const g = x.sections[0].scaled?.gain ?? 1;
    const kp = g * (x.gains.kp as number);
    const kh = (g * (x.gains.ki as number) * analysis.sampleTimeS) / 2;
    return arithmetic === 'float32' ? { arithmetic, kp: Math.fround(kp), ki: Math.fround(kh) } : quantizePiTaps(kp, kh, wordBits);
  };
  const onePu = {
    current: perUnit ? 1 : b.currentBaseA, voltage: perUnit ? 1 : b.voltageBaseV, dc: perUnit ? 1 : b.dcVoltageBaseV,
    frequency: perUnit ? 1 : b.angularFrequencyBaseRadPerS,
  };
  return {
    arithmetic,
    units: r.units,
    wordBits,
    signalFracBits: r.signalFracBits,
    signalMax: max,
    inputOnePu: {
      'voltage-pi': onePu.dc, 'pll-pi': 1, 'current-pr': onePu.current, 'sogi-d': onePu.voltage, 'sogi-q': onePu.voltage, 'reactive-lpf': onePu.current,
    },
    outputOnePu: {
      'voltage-pi': onePu.current, 'pll-pi': onePu.frequency, 'current-pr': onePu.dc, 'sogi-d': onePu.voltage, 'sogi-q': onePu.voltage, 'reactive-lpf': onePu.current,
    },
    blocks: analysis.blocks.map((x) => ({ id: x.id, sections: x.sections.map((s) => sectionSpec(s, arithmetic)) })),
    pi: { 'voltage-pi': piTaps('voltage-pi'), 'pll-pi': piTaps('pll-pi') },
    limits: {
      currentReference: limit(r.currentReferencePeakA / (perUnit ? b.currentBaseA : 1)),
      pllFrequency: limit((2 * Math.PI * r.pllFrequencyDeviationHz) / (perUnit ? b.angularFrequencyBaseRadPerS : 1)),
      modulation: limit(r.modulationIndexMax * (perUnit ? 1 : b.dcVoltageBaseV)),
    },
  };
}
