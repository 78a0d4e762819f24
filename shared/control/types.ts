/**
 * Public data types of the Varsmith numerical core (CONTRACT sections 1 and 3).
 *
 * SI units everywhere; the unit is in the key. These shapes are a public interface: fields may be
 * added, never renamed or removed. Every value that can be absent is `number | null` (never NaN or
 * Infinity, which do not survive JSON).
 */

/** L filter: one inductor with its series resistance. */
export interface LFilterInput {
  topology: 'L';
  inductanceH: number;
  resistanceOhm: number;
}

/** LCL filter: inverter-side L1 (with `resistanceOhm` in series), grid-side L2, Cf with series damping Rd. */
export interface LclFilterInput {
  topology: 'LCL';
  inverterInductanceH: number;
  gridInductanceH: number;
  capacitanceF: number;
  dampingResistanceOhm: number;
  resistanceOhm: number;
}

/** Output filter of the power stage, discriminated by topology. */
export type FilterInput = LFilterInput | LclFilterInput;

/** A `varsmith-design/1` design file (CONTRACT section 1). `null` gains are designed from the targets. */
export interface DesignInput {
  format: 'varsmith-design/1';
  name: string;
  grid: { voltageRmsV: number; frequencyHz: number };
  rating: { apparentPowerVA: number };
  filter: FilterInput;
  dcLink: { capacitanceF: number; voltageRefV: number };
  sampling: { switchingFrequencyHz: number; updatesPerCarrier: number; computationDelaySamples: number };
  currentLoop: {
    crossoverHz: number;
    harmonics: number[];
    resonantBandwidthHz: number;
    kp: number | null;
    resonantGains: number[] | null;
  };
  voltageLoop: { crossoverHz: number; phaseMarginDeg: number; kp: number | null; ki: number | null };
  pll: { sogiGain: number; settlingTimeS: number; dampingRatio: number; kp: number | null; ki: number | null };
  reactiveFilter: { order: 1 | 2; cutoffHz: number };
  fixedPoint: FixedPointInput;
  /** Signals and scaling of the firmware (CONTRACT section 7); absent keys take the documented defaults. */
  signals?: SignalsInput;
  /** Output limits of the control step (CONTRACT section 7); absent keys take the documented defaults. */
  limits?: LimitsInput;
  /** Firmware naming (CONTRACT section 7). */
  firmware?: FirmwareInput;
  /** Operating envelope the fixed controller must ride (CONTRACT section 9). */
  envelope?: EnvelopeInput;
}

/** Arithmetic of the exported set: W-bit fixed point (default) or IEEE-754 single precision. */
export type Arithmetic = 'fixed' | 'float32';

/** Realisation of the recursive sections: Direct Form I (default) or a form whose resonance does not drift with the word. */
export type SectionStructure = 'direct-form-1' | 'quantization-robust';

/** `fixedPoint` of the design file (CONTRACT sections 1 and 7). */
export interface FixedPointInput {
  wordBits: 16 | 32;
  arithmetic?: Arithmetic;
  structure?: SectionStructure;
}

/** Unit system of the block signals: per unit of the bases of CONTRACT section 7 (default), or SI. */
export type SignalUnits = 'per-unit' | 'si';

/** `signals` of the design file (CONTRACT section 7); every key optional. */
export interface SignalsInput {
  units?: SignalUnits;
  /** Fractional bits of every internal signal word (default W - 3 in per unit: range +-4 pu). */
  signalFracBits?: number;
  /** Inverter and load current at ADC full scale, peak A. */
  currentSenseFullScaleA?: number;
  /** Grid voltage at ADC full scale, peak V. */
  gridVoltageSenseFullScaleV?: number;
  /** DC-link voltage at ADC full scale, V. */
  dcVoltageSenseFullScaleV?: number;
  /** Resolution of the (signed) ADC codes, bits. */
  adcBits?: number;
  /** PWM carrier period in timer counts. */
  pwmCarrierCounts?: number;
}

/** `limits` of the design file (CONTRACT section 7); every key optional. */
export interface LimitsInput {
  /** Clamp of the current reference amplitude, peak A. */
  currentReferencePeakA?: number;
  /** Clamp of the modulation index (converter voltage / DC-link voltage). */
  modulationIndexMax?: number;
  /** Clamp of the PLL frequency around nominal, Hz. */
  pllFrequencyDeviationHz?: number;
}

/** `firmware` of the design file (CONTRACT section 7). */
export interface FirmwareInput {
  /** Stable C symbol prefix (functions in lower case, macros in upper case); independent of the display name. */
  symbolPrefix?: string;
}

/** `envelope` of the design file (CONTRACT section 9); every key optional. */
export interface EnvelopeInput {
  /** Weakest grid as a short-circuit ratio; null = stiff grid only. */
  shortCircuitRatioMin?: number | null;
  /** +- fraction applied to every L and Cf. */
  filterTolerance?: number;
  /** Grid-frequency band the unit must ride through, [min, max] Hz. */
  gridFrequencyHz?: [number, number];
  /** +- fraction of the grid voltage. */
  gridVoltageTolerance?: number;
  /** +- fraction of the DC-link capacitance. */
  dcLinkCapacitanceTolerance?: number;
}

/** Identifier of a controller block (CONTRACT section 3). */
export type BlockId = 'voltage-pi' | 'pll-pi' | 'current-pr' | 'sogi-d' | 'sogi-q' | 'reactive-lpf';

/** Identifier of an analysed sampled loop. */
export type LoopId = 'current' | 'voltage' | 'pll';

/** Severity of a check: `error` blocks a release. */
export type Severity = 'error' | 'warning' | 'info';

/**
 * What a second-order section is, so fixed-point analysis knows which properties matter:
 * `gain` (b0 only), `pi` (Tustin integrator plus gain, pole at z = 1 by design), `resonator`
 * (band-pass at a harmonic), `sogi-band-pass`, `sogi-low-pass` (share the SOGI denominator),
 * `low-pass` (unity-DC-gain estimator filter).
 */
export type SectionKind = 'gain' | 'pi' | 'resonator' | 'sogi-band-pass' | 'sogi-low-pass' | 'low-pass';

/** One finding of the plant, design, stability or fixed-point checks. */
export interface Check {
  /** Stable kebab-case id, e.g. `pr-h1-quantization-drift`. */
  id: string;
  severity: Severity;
  /** Human-readable sentence; errors and warnings name a remedy. */
  message: string;
  value: number | null;
  limit: number | null;
  unit: string | null;
  /** Block the check belongs to, when it belongs to one. */
  blockId?: BlockId | null;
  /** What to do about it (errors and warnings). */
  remedy?: string | null;
}

/** Quantized coefficients of one section (CONTRACT section 3, fixed point). */
export interface FixedCoefficients {
  /** Word length W in bits (16 or 32). */
  wordBits: number;
  /** Fraction bits F: largest integer <= 62 with every round(c * 2^F) within +-(2^(W-1) - 1). */
  fracBits: number;
  /** round-half-away-from-zero(b_i * 2^F), three entries. */
  b: number[];
  /** round-half-away-from-zero(a_i * 2^F), three entries (a[0] = 2^F when it fits). */
  a: number[];
  /** Label `Q<W-F>.<F>` such as `Q2.30` for W = 32, F = 30 (integer bits including sign . fraction bits); `Q-3.35` or `Q18.-2` in the extremes. */
  qFormat: string;
}

/** A section's coefficients scaled to the signals of its block (CONTRACT section 7). */
export interface ScaledCoefficients {
  /** Unit system the block's signals use. */
  units: SignalUnits;
  /** Factor g applied to the numerator (1 in SI). */
  gain: number;
  /** [g*b0, g*b1, g*b2]. */
  b: number[];
  /** [1, a1, a2], unchanged. */
  a: number[];
}

/**
 * Realisation of one recursive section: `direct-form-1` (CONTRACT section 3) or `delta-operator`, the
 * transposed direct form II in the delta operator (delta = z - 1) whose feedback coefficients
 * c1 = 2 + a1 and c2 = 1 + a1 + a2 keep their own scaling (Newman & Holmes, IEEE TPEL 18(1), 2003).
 */
export type SectionForm = 'direct-form-1' | 'delta-operator';

/**
 * Quantized coefficients of a delta-operator section: every coefficient has its own fraction bits
 * (the largest F with round(c * 2^F) within +-(2^(W-1) - 1), the CONTRACT rule applied one
 * coefficient at a time), and the two states carry G guard bits below the signal LSB.
 */
export interface DeltaFixedCoefficients {
  /** Word length W of the signals and of every coefficient integer. */
  wordBits: number;
  /** Integers of [b0, d1, d2, c1, c2]. */
  codes: number[];
  /** Fraction bits of each integer, same order. */
  fracBits: number[];
  /** Q-format label of each integer, same order. */
  qFormats: string[];
  /** Guard bits G: the states are 64-bit integers in units of 2^-G signal LSB. */
  guardBits: number;
}

/**
 * A section in the delta-operator form: H = (b0 + d1 D + d2 D^2) / (1 + c1 D + c2 D^2) with
 * D = 1 / (z - 1) (a delayed accumulator), equal to the Direct Form I section
 * (b0 + b1 z^-1 + b2 z^-2) / (1 + a1 z^-1 + a2 z^-2) for d1 = 2 b0 + b1, d2 = b0 + b1 + b2,
 * c1 = 2 + a1, c2 = 1 + a1 + a2.
 */
export interface DeltaSection {
  form: 'delta-operator';
  /** [b0, d1, d2, c1, c2] of the scaled section (numerator times g), computed without cancellation. */
  coefficients: number[];
  /** Their quantization (fixed arithmetic). */
  fixed: DeltaFixedCoefficients;
}

/** What single precision does to one section (`fixedPoint.arithmetic = "float32"`). */
export interface Float32SectionAnalysis {
  /** Form whose coefficients were rounded. */
  form: SectionForm;
  /** The binary32 coefficients of that form: [b0, b1, b2, a1, a2] or [b0, d1, d2, c1, c2]. */
  coefficients: number[];
  /** Resonance of the rounded coefficients, Hz (resonator and SOGI sections; null when the poles turned real). */
  resonanceHz: number | null;
  /** DC gain of the rounded coefficients (null where a pole sits at z = 1). */
  dcGain: number | null;
  /** Largest pole radius of the rounded coefficients. */
  maxPoleRadius: number;
  /**
   * Low-pass sections: where the bit-exact single-precision model settles for a held input of
   * `stall.inputPu`, as a fraction off the exact value (null for other kinds).
   */
  stall: { inputPu: number; settledOutput: number; relativeError: number; samples: number } | null;
}

/** One second-order section: y = sum b_i x[n-i] - sum_{i>=1} a_i y[n-i]. */
export interface SectionResult {
  /** `proportional`, `resonant-h<h>`, `pi`, `band-pass`, `low-pass`. */
  role: string;
  kind: SectionKind;
  /** Prewarp frequency in Hz, null when not prewarped. */
  prewarpHz: number | null;
  /** Numerator in powers of z^-1, three entries (zero-padded). */
  b: number[];
  /** Denominator in powers of z^-1, three entries, a[0] = 1. */
  a: number[];
  /** Resonator and SOGI sections: centre frequency acos(-a1/(1+a2))/(2*pi*Ts). */
  resonanceHz?: { design: number; discrete: number | null; fixed: number | null; float32?: number | null };
  /** Resonator sections: where the resonance lands with other discretizations (Hz), for comparison. */
  resonanceByMethodHz?: Record<string, number | null>;
  /** The section scaled to its block's signals (CONTRACT section 7): numerator times g, denominator unchanged. */
  scaled?: ScaledCoefficients;
  /** Quantization of `scaled` (of b and a when `scaled` is absent). */
  fixed: FixedCoefficients;
  /** Form this section runs in (CONTRACT section 7): `delta-operator` for resonators, SOGI and low-passes with the quantization-robust structure. */
  structure?: SectionForm;
  /** The delta-operator coefficients and their integers, when `structure` is `delta-operator`. */
  delta?: DeltaSection;
  /** Single-precision analysis, when the design's arithmetic is float32. */
  float32?: Float32SectionAnalysis;
  /** Fixed-point properties of this section (headroom, dead band, DC gain...). */
  fixedAnalysis?: FixedSectionAnalysis;
}

/** Fixed-point properties of a quantized section, computed by `analyzeFixedSection`. */
export interface FixedSectionAnalysis {
  /** DC gain H(1) from the double and the quantized coefficients (null where H(1) is infinite). */
  dcGain: { discrete: number | null; fixed: number | null };
  /** Largest pole radius of the quantized section. */
  maxPoleRadiusFixed: number;
  /** l1 norm of the impulse response to the output (worst-case gain for a full-scale input); null = unbounded. */
  outputL1Norm: number | null;
  /** Integer bits the output/state needs beyond the signal word for a full-scale input; null = unbounded. */
  headroomBits: number | null;
  /** Dead band: how many LSB the output can stall off its true value with round-to-nearest (null when not recursive or unbounded); for `pi` sections the input error in LSB below which the integrator never moves. */
  deadbandLsb: number | null;
  /** Coefficients whose double value is non-zero but quantize to 0. */
  lostCoefficients: string[];
  /** Why a field is null (unbounded state, lost integral, not recursive), one sentence each. */
  notes?: string[];
}

/** One designed, discretized, quantized controller block. */
export interface BlockResult {
  id: BlockId;
  /** `tustin`, `tustin-prewarp` or `none` (pure gain). */
  method: 'tustin' | 'tustin-prewarp' | 'none';
  /** The gains in use (designed or overridden), SI / per-unit as documented per block. */
  gains: Record<string, number | number[]>;
  /** Whether each gain came from the design rule or from the design file. */
  gainSource?: Record<string, 'rule' | 'override'>;
  /** Parallel second-order sections; the block output is their sum. */
  sections: SectionResult[];
}

/** One unity-gain or -180 degree crossing of an open loop. */
export interface LoopCrossing {
  frequencyHz: number;
  /** Phase margin (unity-gain crossing) in degrees or gain margin (phase crossing) in dB. */
  marginValue: number;
  kind: 'gain-crossover' | 'phase-crossover';
}

/** Stability summary of one sampled loop (CONTRACT section 3). */
export interface LoopResult {
  id: LoopId;
  /** Highest unity-gain crossing, null when |L| never crosses 1. */
  crossoverHz: number | null;
  /** Worst phase margin over all unity-gain crossings, null when there is none. */
  phaseMarginDeg: number | null;
  /** Worst gain margin over the -180 degree crossings with |L| < 1; null when there is none. */
  gainMarginDb: number | null;
  /** max |1/(1+L)| over 0..Nyquist. */
  peakSensitivity: number;
  /** Roots of the closed-loop characteristic polynomial, as [re, im]. */
  closedLoopPoles: [number, number][];
  maxPoleRadius: number;
  stable: boolean;
  crossings?: LoopCrossing[];
  /** Why a margin is null, when one is. */
  notes?: string[];
}

/** Frequency response sampled on a grid, for plots. */
export interface FrequencyResponseData {
  frequencyHz: number[];
  magnitudeDb: number[];
  phaseDeg: number[];
}

/** Time response sampled at the loop's sampling period, for plots. */
export interface TimeResponseData {
  timeS: number[];
  value: number[];
  /** What `value` is, with unit, e.g. `inverter current (A) for a 1 A reference step`. */
  label: string;
}

/** Plot data: open-loop frequency responses per loop and the four step responses. */
export interface AnalysisResponses {
  openLoop: Record<LoopId, FrequencyResponseData>;
  /** `current-step`, `pll-phase-step`, `dc-link-load-step`, `estimator-step`. */
  time: Record<string, TimeResponseData>;
  /** Open-loop poles and zeros per loop in the z plane, as [re, im]. */
  poleZero?: Record<LoopId, { poles: [number, number][]; zeros: [number, number][] }>;
}

/** Explicit analysis options (no hidden defaults change numbers). */
export interface AnalysisOptions {
  /** Points per frequency sweep (log-spaced up to Nyquist); 0 = no plot data. */
  sweepPoints: number;
  /** Samples per time response; 0 = no time responses. */
  responseSamples: number;
}

/** A `varsmith-analysis/1` result (CONTRACT section 3). */
export interface AnalysisResult {
  format: 'varsmith-analysis/1';
  sampleTimeS: number;
  blocks: BlockResult[];
  loops: LoopResult[];
  plant: Record<string, number | boolean | string | null>;
  checks: Check[];
  responses?: AnalysisResponses;
}
