/**
 * Signals, per-unit bases, scaling factors, sensing and limits of the firmware (CONTRACT section 7).
 *
 * Every block of the set runs on named signals: in per unit (the default) each signal is divided by
 * its base, and a block whose input and output have different bases gets its numerator multiplied by
 * g = (input base) / (output base), so the same difference equation maps per-unit in to per-unit out.
 * Absent design keys take the documented defaults below; `resolveSignals` says which value came from
 * where. Pure: numbers in, numbers out.
 */
import { qFormatLabel } from './quantize';
import type { Arithmetic, BlockId, DesignInput, SectionStructure, SignalUnits } from './types';

/** Per-unit bases of a design (CONTRACT section 7), SI. */
export interface PerUnitBases {
  /** Vbase = sqrt(2) * voltageRmsV: grid voltage amplitude, V. */
  voltageBaseV: number;
  /** Ibase = sqrt(2) * apparentPowerVA / voltageRmsV: rated current amplitude, A. */
  currentBaseA: number;
  /** VdcBase = voltageRefV: DC-link voltage reference, V. */
  dcVoltageBaseV: number;
  /** wBase = 2 * pi * frequencyHz: nominal grid angular frequency, rad/s. */
  angularFrequencyBaseRadPerS: number;
  /** Zbase = Vbase / Ibase, ohm. */
  impedanceBaseOhm: number;
}

/**
 * Per-unit bases of CONTRACT section 7.
 *
 * Method: amplitude-based single-phase per-unit system, Vbase = sqrt(2) Vrms, Ibase = sqrt(2) S / Vrms
 * (so Vbase * Ibase / 2 = S), VdcBase = Vdc reference, wBase = 2 pi f (Kundur, "Power System
 * Stability and Control", 1994, per-unit systems, from memory; CONTRACT section 7 fixes the choice).
 *
 * @param design - a validated design.
 * @returns the bases in V, A, V, rad/s and ohm.
 * @example
 * perUnitBases(sc3).currentBaseA; // => 38.89 (sqrt(2) * 3300 / 120)
 */
export function perUnitBases(design: DesignInput): PerUnitBases {
  const voltageBaseV = Math.SQRT2 * design.grid.voltageRmsV;
  const currentBaseA = (Math.SQRT2 * design.rating.apparentPowerVA) / design.grid.voltageRmsV;
  return {
    voltageBaseV,
    currentBaseA,
    dcVoltageBaseV: design.dcLink.voltageRefV,
    angularFrequencyBaseRadPerS: 2 * Math.PI * design.grid.frequencyHz,
    impedanceBaseOhm: voltageBaseV / currentBaseA,
  };
}

/**
 * Documented defaults of the optional `signals` and `limits` keys, as multiples of the rated
 * quantities. Each is common practice (no single source) unless a source is named.
 */
export const SIGNAL_DEFAULTS = {
  /**
   * Current sensor full scale = 2 x rated peak current: room for the switching ripple, a 1.2 pu
   * reference limit and the over-current trip above it without clipping the ADC (common practice, no source).
   */
  currentSenseFullScalePerRatedPeak: 2,
  /**
   * Grid-voltage sensor full scale = 1.5 x nominal peak: covers steady +10 % and short swells up to
   * about 1.4 pu that ride-through rules ask a unit to see (common practice, no source).
   */
  gridVoltageSenseFullScalePerPeak: 1.5,
  /** DC-link sensor full scale = 1.5 x the reference: sees overshoot and the over-voltage trip (common practice, no source). */
  dcVoltageSenseFullScalePerReference: 1.5,
  /** 12-bit ADC: the converter built into most motor-control microcontrollers (common practice, no source). */
  adcBits: 12,
  /**
   * Timer clock assumed for the default carrier period: 100 MHz with up-down (centre-aligned) counting,
   * so carrier counts = 100 MHz / (2 * fsw), e.g. 2500 at 20 kHz (common practice, no source).
   */
  pwmTimerClockHz: 100e6,
  /** Carrier counts are kept within a 16-bit timer period register by default (common practice, no source). */
  pwmCarrierCountsMax: 65535,
  /** Smallest default carrier period, counts. */
  pwmCarrierCountsMin: 16,
  /** Current reference limit = 1.2 x rated peak: a 20 % short-time overload (common practice, no source). */
  currentReferencePerRatedPeak: 1.2,
  /**
   * Modulation index limit 0.95: keeps the narrowest pulse above the dead time and the bridge's
   * minimum on-time at the peaks (common practice, no source).
   */
  modulationIndexMax: 0.95,
  /**
   * PLL frequency clamp = +-10 % of nominal (+-6 Hz at 60 Hz): wider than the ride-through bands of
   * interconnection rules such as IEEE 1547-2018 (56.5 Hz to 62 Hz at 60 Hz, from memory).
   */
  pllFrequencyDeviationPerNominal: 0.1,
  /** Per-unit signals: W - 3 fraction bits, i.e. a range of +-4 pu (CONTRACT section 7). */
  perUnitIntegerBits: 3,
} as const;

/** Where a resolved value came from. */
export type ValueSource = 'design' | 'default';

/** The signal, sensing, limit and naming settings of a design with every default filled in. */
export interface ResolvedSignals {
  units: SignalUnits;
  arithmetic: Arithmetic;
  structure: SectionStructure;
  /** Word length W of signals and coefficients, bits. */
  wordBits: 16 | 32;
  /** Fractional bits of every internal signal word (fixed arithmetic; kept for float32 too). */
  signalFracBits: number;
  /** Q format of the internal signals, e.g. `Q3.29`, or `binary32` for float32. */
  signalFormat: string;
  currentSenseFullScaleA: number;
  gridVoltageSenseFullScaleV: number;
  dcVoltageSenseFullScaleV: number;
  adcBits: number;
  pwmCarrierCounts: number;
  currentReferencePeakA: number;
  modulationIndexMax: number;
  pllFrequencyDeviationHz: number;
  /** Stable C prefix from `firmware.symbolPrefix`, null when the design has none. */
  symbolPrefix: string | null;
  /** Source of every key above that the design file may set, by key path (`signals.adcBits`...). */
  sources: Record<string, ValueSource>;
}

/**
 * Default fraction bits of the internal signals.
 *
 * Rule: per unit, W - 3 (range +-4 pu, CONTRACT section 7). SI: one bit of headroom over the largest
 * sensed full scale (A or V), i.e. F = W - 2 - ceil(log2(max full scale)), at least 0.
 *
 * @param units - signal units.
 * @param wordBits - W.
 * @param largestFullScale - largest of the sensed full scales in A or V (SI only).
 * @returns F, an integer in [0, W - 1].
 * @example
 * defaultSignalFracBits('per-unit', 32, 0); // => 29
 * defaultSignalFracBits('si', 32, 500); // => 21 (range +-1024)
 */
export function defaultSignalFracBits(units: SignalUnits, wordBits: number, largestFullScale: number): number {
  if (units === 'per-unit') return wordBits - SIGNAL_DEFAULTS.perUnitIntegerBits;
  const integerBits = Math.max(0, Math.ceil(Math.log2(Math.max(1, largestFullScale))));
  return Math.max(0, wordBits - 2 - integerBits);
}

/**
 * Default PWM carrier period in counts: timer clock / (2 * fsw), rounded, kept within [16, 65535]
 * (see {@link SIGNAL_DEFAULTS}).
 *
 * @param switchingFrequencyHz - carrier frequency, Hz.
 * @returns counts (integer).
 * @example
 * defaultCarrierCounts(20000); // => 2500
 */
export function defaultCarrierCounts(switchingFrequencyHz: number): number {
  const counts = Math.round(SIGNAL_DEFAULTS.pwmTimerClockHz / (2 * switchingFrequencyHz));
  return Math.min(SIGNAL_DEFAULTS.pwmCarrierCountsMax, Math.max(SIGNAL_DEFAULTS.pwmCarrierCountsMin, counts));
}

/**
 * Every signal, sensing, limit and naming setting of a design, defaults filled in (CONTRACT section 7).
 *
 * @param design - a validated design (the optional sections may be absent).
 * @returns the resolved settings with their sources.
 * @example
 * resolveSignals(sc3).currentSenseFullScaleA; // => 77.78 (2 x 38.89 A, default)
 */
export function resolveSignals(design: DesignInput): ResolvedSignals {
  const sources: Record<string, ValueSource> = {};
  const bases = perUnitBases(design);
  const s = design.signals ?? {};
  const l = design.limits ?? {};
  const pick = <T>(path: string, given: T | undefined, fallback: () => T): T => {
    sources[path] = given === undefined ? 'default' : 'design';
    return given === undefined ? fallback() : given;
  };
  const wordBits = design.fixedPoint.wordBits;
  const units = pick<SignalUnits>('signals.units', s.units, () => 'per-unit');
  const arithmetic = pick<Arithmetic>('fixedPoint.arithmetic', design.fixedPoint.arithmetic, () => 'fixed');
  const structure = pick<SectionStructure>('fixedPoint.structure', design.fixedPoint.structure, () => 'direct-form-1');
  const currentSenseFullScaleA = pick('signals.currentSenseFullScaleA', s.currentSenseFullScaleA,
    () => SIGNAL_DEFAULTS.currentSenseFullScalePerRatedPeak * bases.currentBaseA);
  const gridVoltageSenseFullScaleV = pick('signals.gridVoltageSenseFullScaleV', s.gridVoltageSenseFullScaleV,
    () => SIGNAL_DEFAULTS.gridVoltageSenseFullScalePerPeak * bases.voltageBaseV);
  const dcVoltageSenseFullScaleV = pick('signals.dcVoltageSenseFullScaleV', s.dcVoltageSenseFullScaleV,
    () => SIGNAL_DEFAULTS.dcVoltageSenseFullScalePerReference * bases.dcVoltageBaseV);
  const largestFullScale = Math.max(currentSenseFullScaleA, gridVoltageSenseFullScaleV, dcVoltageSenseFullScaleV);
  const signalFracBits = pick('signals.signalFracBits', s.signalFracBits,
    () => defaultSignalFracBits(units, wordBits, largestFullScale));
  return {
    units,
    arithmetic,
    structure,
    wordBits,
    signalFracBits,
    signalFormat: arithmetic === 'float32' ? 'binary32' : qFormatLabel(wordBits, signalFracBits),
    currentSenseFullScaleA,
    gridVoltageSenseFullScaleV,
    dcVoltageSenseFullScaleV,
    adcBits: pick('signals.adcBits', s.adcBits, () => SIGNAL_DEFAULTS.adcBits),
    pwmCarrierCounts: pick('signals.pwmCarrierCounts', s.pwmCarrierCounts,
      () => defaultCarrierCounts(design.sampling.switchingFrequencyHz)),
    currentReferencePeakA: pick('limits.currentReferencePeakA', l.currentReferencePeakA,
      () => SIGNAL_DEFAULTS.currentReferencePerRatedPeak * bases.currentBaseA),
    modulationIndexMax: pick('limits.modulationIndexMax', l.modulationIndexMax, () => SIGNAL_DEFAULTS.modulationIndexMax),
    pllFrequencyDeviationHz: pick('limits.pllFrequencyDeviationHz', l.pllFrequencyDeviationHz,
      () => SIGNAL_DEFAULTS.pllFrequencyDeviationPerNominal * design.grid.frequencyHz),
    symbolPrefix: design.firmware?.symbolPrefix ?? null,
    sources,
  };
}

/** Name of a per-unit base. */
export type BaseName = 'Vbase' | 'Ibase' | 'VdcBase' | 'wBase' | 'none';

/** One signal of a block: what it is, its SI unit, and the base it is divided by. */
export interface SignalDescriptor {
  /** What the signal is, e.g. `current error`. */
  quantity: string;
  /** SI unit of the physical quantity: `A`, `V`, `rad/s` or `1` (dimensionless). */
  siUnit: 'A' | 'V' | 'rad/s' | '1';
  /** Unit of the number the firmware holds: `pu` or the SI unit. */
  unit: string;
  /** Base the physical value is divided by (`none` in SI or for ratios). */
  baseName: BaseName;
  /** Value of that base in the SI unit (1 when `none`). */
  baseValue: number;
  /** Number format of the signal word, e.g. `Q3.29` or `binary32`. */
  format: string;
  /** Per-unit base of the quantity whatever the units (for per-unit words in findings). */
  puBaseName: BaseName;
  /** Its value in the SI unit (1 for `none`). */
  puBaseValue: number;
  /** The number the firmware holds for 1 pu of this quantity: 1 in per unit, the base value in SI. */
  onePu: number;
}

/** Input and output signals of one block and the numerator factor g that maps them. */
export interface BlockSignals {
  blockId: BlockId;
  input: SignalDescriptor;
  output: SignalDescriptor;
  /** g = input base / output base in per unit, 1 in SI (CONTRACT section 7 table). */
  gain: number;
}

// Physical meaning and base of each block's signals (CONTRACT section 7 table).
const BLOCK_SIGNAL_TABLE: Record<BlockId, { input: [string, SignalDescriptor['siUnit'], BaseName]; output: [string, SignalDescriptor['siUnit'], BaseName] }> = {
  'current-pr': { input: ['current error', 'A', 'Ibase'], output: ['converter voltage', 'V', 'VdcBase'] },
  'voltage-pi': { input: ['DC-link voltage error', 'V', 'VdcBase'], output: ['active current amplitude', 'A', 'Ibase'] },
  'pll-pi': { input: ['q-axis voltage / its amplitude', '1', 'none'], output: ['frequency deviation', 'rad/s', 'wBase'] },
  'sogi-d': { input: ['grid voltage', 'V', 'Vbase'], output: ['in-phase grid voltage', 'V', 'Vbase'] },
  'sogi-q': { input: ['grid voltage', 'V', 'Vbase'], output: ['quadrature grid voltage', 'V', 'Vbase'] },
  'reactive-lpf': { input: ['load current x cos template', 'A', 'Ibase'], output: ['low-passed load current x cos template', 'A', 'Ibase'] },
};

/** The block ids in CONTRACT order. */
export const BLOCK_IDS: readonly BlockId[] = ['voltage-pi', 'pll-pi', 'current-pr', 'sogi-d', 'sogi-q', 'reactive-lpf'];

function baseValue(bases: PerUnitBases, name: BaseName): number {
  switch (name) {
    case 'Vbase': return bases.voltageBaseV;
    case 'Ibase': return bases.currentBaseA;
    case 'VdcBase': return bases.dcVoltageBaseV;
    case 'wBase': return bases.angularFrequencyBaseRadPerS;
    case 'none': return 1;
  }
}

/**
 * Input and output signals of every block, with the numerator factor g (CONTRACT section 7).
 *
 * Method: per unit, x_pu = x / base_in and y_pu = y / base_out, so y = H x becomes
 * y_pu = (base_in / base_out) H x_pu: the numerator is multiplied by g = base_in / base_out and the
 * denominator (the dynamics) is unchanged. In SI, g = 1 and every base is `none`.
 *
 * @param design - a validated design.
 * @returns one entry per block, in CONTRACT order.
 * @example
 * blockSignals(sc3).find((b) => b.blockId === 'current-pr').gain; // => 0.19445 (38.89 A / 200 V)
 */
export function blockSignals(design: DesignInput): BlockSignals[] {
  const resolved = resolveSignals(design);
  const bases = perUnitBases(design);
  const perUnit = resolved.units === 'per-unit';
  const describe = ([quantity, siUnit, base]: [string, SignalDescriptor['siUnit'], BaseName]): SignalDescriptor => {
    const name: BaseName = perUnit ? base : 'none';
    return {
      quantity,
      siUnit,
      unit: perUnit && base !== 'none' ? 'pu' : siUnit,
      baseName: name,
      baseValue: baseValue(bases, name),
      format: resolved.signalFormat,
      puBaseName: base,
      puBaseValue: baseValue(bases, base),
      onePu: perUnit ? 1 : baseValue(bases, base),
    };
  };
  return BLOCK_IDS.map((blockId) => {
    const entry = BLOCK_SIGNAL_TABLE[blockId];
    const input = describe(entry.input);
    const output = describe(entry.output);
    return { blockId, input, output, gain: input.baseValue / output.baseValue };
  });
}

/**
 * The numerator factor g of one block (CONTRACT section 7).
 *
 * @param design - a validated design.
 * @param blockId - the block.
 * @returns g (dimensionless in per unit; 1 in SI).
 * @example
 * blockScaleFactor(sc3, 'pll-pi'); // => 1 / (2 * pi * 60) = 0.002653
 */
export function blockScaleFactor(design: DesignInput, blockId: BlockId): number {
  const entry = blockSignals(design).find((b) => b.blockId === blockId);
  return entry ? entry.gain : 1;
}

/** Conversion constants of a set: sensed codes to signals, modulation to compare counts, feed-forward. */
export interface ConversionConstants {
  /** Value of one current ADC code in the signal unit (pu of Ibase, or A). */
  currentPerCode: number;
  /** Value of one grid-voltage ADC code (pu of Vbase, or V). */
  gridVoltagePerCode: number;
  /** Value of one DC-link ADC code (pu of VdcBase, or V). */
  dcVoltagePerCode: number;
  /** Compare counts per unit of modulation index (half the carrier period: m = 1 swings a leg over the whole period). */
  countsPerModulation: number;
  /** Grid-voltage feed-forward: converter voltage signal per grid-voltage signal (Vbase / VdcBase in per unit, 1 in SI). */
  feedForwardFactor: number;
  /** Reactive estimate factor: q amplitude = 2 x low-pass(i x cos template) (the mean of sin^2 is 1/2). */
  reactiveFactor: number;
}

/** Factor 2 of the reactive estimate (mean of the product of two unit sines in phase is 1/2; CONTRACT section 2). */
export const REACTIVE_FACTOR = 2;

/**
 * Conversion constants of a design (CONTRACT section 7): signed ADC codes in
 * [-2^(N-1), 2^(N-1) - 1] span +-full scale, so one code is fullScale / 2^(N-1), divided by the
 * base in per unit.
 *
 * @param design - a validated design.
 * @returns the constants (doubles; the exporter quantizes them in stated formats).
 * @example
 * conversionConstants(sc3).currentPerCode; // => 2 * 38.89 / 2048 / 38.89 = 9.765625e-4 pu
 */
export function conversionConstants(design: DesignInput): ConversionConstants {
  const r = resolveSignals(design);
  const b = perUnitBases(design);
  const perUnit = r.units === 'per-unit';
  const codes = 2 ** (r.adcBits - 1);
  return {
    currentPerCode: r.currentSenseFullScaleA / codes / (perUnit ? b.currentBaseA : 1),
    gridVoltagePerCode: r.gridVoltageSenseFullScaleV / codes / (perUnit ? b.voltageBaseV : 1),
    dcVoltagePerCode: r.dcVoltageSenseFullScaleV / codes / (perUnit ? b.dcVoltageBaseV : 1),
    countsPerModulation: r.pwmCarrierCounts / 2,
    feedForwardFactor: perUnit ? b.voltageBaseV / b.dcVoltageBaseV : 1,
    reactiveFactor: REACTIVE_FACTOR,
  };
}
