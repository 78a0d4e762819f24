import type { BlockResult, Check, DeltaFixedCoefficients, FixedCoefficients, FixedSectionAnalysis, SectionKind, SectionResult } from './types';
import { resonanceHzFromDenominator } from './resonance';
import { scaleByPowerOfTwo } from './quantize';
import { sectionName } from './names';
import { DELTA_COEFFICIENT_NAMES, dequantizeDelta, directFormFromDelta } from './deltaOperator';

/** What fixed-point analysis needs to know about a section. */
export interface SectionForFixedAnalysis {
  /** `proportional`, `resonant-h<h>`, `pi`, `band-pass`, `low-pass`. */
  role: string;
  kind: SectionKind;
  /** Double-precision numerator in powers of z^-1, three entries. */
  b: readonly number[];
  /** Double-precision denominator in powers of z^-1, three entries, a[0] = 1. */
  a: readonly number[];
  /** Prewarp (design) frequency in Hz, null when not prewarped. */
  prewarpHz: number | null;
}

/** Iteration cap of the impulse-response sums (beyond it a geometric tail estimate is added). */
const MAX_IMPULSE_SAMPLES = 10_000_000;

/**
 * Largest pole radius of a section with denominator [1, a1, a2] (powers of z^-1), i.e. of the
 * roots of z^2 + a1 z + a2.
 *
 * Method: complex pair (a1^2 < 4 a2): |z| = sqrt(a2); real roots by the cancellation-free
 * quadratic formula q = -(a1 + sign(a1) sqrt(a1^2 - 4 a2)) / 2, roots q and a2 / q.
 *
 * @param a - denominator [1, a1, a2] (dimensionless); missing entries are 0.
 * @returns the largest root magnitude (0 for a pure gain).
 * @example
 * maxPoleRadius([1, -1.999753264963321, 1]); // => 1 (ideal resonator)
 * maxPoleRadius([1, -0.5, 0]); // => 0.5
 */
export function maxPoleRadius(a: readonly number[]): number {
  const a0 = a[0] ?? 1;
  const a1 = (a[1] ?? 0) / a0;
  const a2 = (a[2] ?? 0) / a0;
  if (a2 === 0) return Math.abs(a1);
  const disc = a1 * a1 - 4 * a2;
  if (disc < 0) return Math.sqrt(a2);
  const q = -(a1 + (a1 >= 0 ? 1 : -1) * Math.sqrt(disc)) / 2;
  return Math.max(Math.abs(q), Math.abs(a2 / q));
}

/**
 * l1 norm sum |h[n]| of the impulse response of B(z)/A(z) (powers of z^-1, a[0] = 1), the
 * worst-case peak output for a unit-peak input (Oppenheim & Schafer, "Discrete-Time Signal
 * Processing", scaling for overflow by the l1 norm).
 *
 * Method: h[0..3] by the recursion; from n = 2 on the response is homogeneous,
 * h[n] = C1 p1^(n-2) + C2 p2^(n-2). First order: geometric series. Complex poles p = r e^{j theta}:
 * h[n] = 2 Re(C p^m) = 2 |C| r^m cos(m theta + psi) keeps its sign between the zero crossings
 * m theta + psi = pi/2 + k pi, so each run contributes |2 Re(C (p^s - p^e) / (1 - p))| (geometric sum
 * of the run) and the sum needs about (number of half periods) steps instead of one per sample; it
 * stops when the remaining envelope 2 |C| r^s / (1 - r) is below 1e-11 of the sum. Real second-order
 * poles, or complex poles with sin(theta) < 1e-6, use {@link impulseResponseL1NormDirect}.
 *
 * @param b - numerator, up to three entries.
 * @param a - denominator [1, a1, a2].
 * @returns the norm (dimensionless), or null when a pole lies on or outside the unit circle (unbounded).
 * @example
 * impulseResponseL1Norm([0.5], [1, -0.5, 0]); // => 1 (0.5 * sum 0.5^n)
 */
export function impulseResponseL1Norm(b: readonly number[], a: readonly number[]): number | null {
  const b0 = b[0] ?? 0;
  const b1 = b[1] ?? 0;
  const b2 = b[2] ?? 0;
  const a1 = a[1] ?? 0;
  const a2 = a[2] ?? 0;
  if (a1 === 0 && a2 === 0) return Math.abs(b0) + Math.abs(b1) + Math.abs(b2);
  const radius = maxPoleRadius([1, a1, a2]);
  if (!(radius < 1)) return null;
  const h0 = b0;
  const h1 = b1 - a1 * h0;
  const h2 = b2 - a1 * h1 - a2 * h0;
  if (a2 === 0) return Math.abs(h0) + Math.abs(h1) + Math.abs(h2) / (1 - Math.abs(a1));
  const h3 = -a1 * h2 - a2 * h1;
  const disc = a1 * a1 - 4 * a2;
  if (disc >= 0) return impulseResponseL1NormDirect(b, a);
  const re = -a1 / 2;
  const im = Math.sqrt(-disc) / 2;
  const theta = Math.atan2(im, re); // (0, pi)
  if (Math.sin(theta) < 1e-6) return impulseResponseL1NormDirect(b, a);
  // C = (h3 - conj(p) h2) / (p - conj(p)), p - conj(p) = 2j im
  const numRe = h3 - re * h2;
  const numIm = im * h2;
  const cRe = numIm / (2 * im);
  const cIm = -numRe / (2 * im);
  const cAbs = Math.sqrt(cRe * cRe + cIm * cIm);
  let sum = Math.abs(h0) + Math.abs(h1);
  if (cAbs === 0) return sum;
  const psi = Math.atan2(cIm, cRe);
  // 1 / (1 - p)
  const dRe = 1 - re;
  const dIm = -im;
  const dAbs2 = dRe * dRe + dIm * dIm;
  const invRe = dRe / dAbs2;
  const invIm = -dIm / dAbs2;
  // Sign runs: cos(m theta + psi) changes sign after m = c0 + k P (P = pi / theta), so run k ends at
  // floor(c0 + k P) + 1. Run lengths are floor(P) or floor(P) + 1 (other lengths only at the start),
  // their powers p^L are precomputed; p^start is carried by multiplication (relative drift about
  // 1e-16 per run).
  const period = Math.PI / theta;
  const c0 = (Math.PI / 2 - psi) / theta;
  const power = (m: number): [number, number, number] => {
    const rm = radius ** m;
    return [rm * Math.cos(m * theta), rm * Math.sin(m * theta), rm];
  };
  const shortLength = Math.floor(period);
  const shortPower = power(shortLength);
  const longPower = power(shortLength + 1);
  let k = Math.floor(-c0 / period) + 1;
  let start = 0;
  let pRe = 1;
  let pIm = 0;
  let envelope = 2 * cAbs; // 2 |C| r^start
  for (let guard = 0; guard < 100_000_000; guard += 1) {
    if (envelope / (1 - radius) <= 1e-11 * sum) break;
    let end = Math.floor(c0 + k * period) + 1;
    k += 1;
    if (end <= start) end = start + 1;
    const length = end - start;
    const step = length === shortLength ? shortPower : length === shortLength + 1 ? longPower : power(length);
    const qRe = pRe * step[0] - pIm * step[1];
    const qIm = pRe * step[1] + pIm * step[0];
    // run sum of C p^m over [start, end): C (p^start - p^end) / (1 - p), real part doubled
    const diffRe = pRe - qRe;
    const diffIm = pIm - qIm;
    const gRe = diffRe * invRe - diffIm * invIm;
    const gIm = diffRe * invIm + diffIm * invRe;
    sum += Math.abs(2 * (cRe * gRe - cIm * gIm));
    envelope *= step[2];
    start = end;
    pRe = qRe;
    pIm = qIm;
  }
  return sum;
}

/**
 * l1 norm of the impulse response by running the recursion h[n] = b_n - a1 h[n-1] - a2 h[n-2] in
 * binary64 until the pole envelope r^n has decayed below 1e-13 (twice that horizon, for repeated
 * poles); past 10^7 samples a geometric tail max|h| r / (1 - r) over the last samples is added as
 * an estimate. The reference for {@link impulseResponseL1Norm} and its fallback.
 *
 * @param b - numerator, up to three entries.
 * @param a - denominator [1, a1, a2].
 * @returns the norm (dimensionless), or null when a pole lies on or outside the unit circle.
 * @example
 * impulseResponseL1NormDirect([1], [1, 0, -0.25]); // => 1.3333 (1 + 0.25 + 0.0625 + ...)
 */
export function impulseResponseL1NormDirect(b: readonly number[], a: readonly number[]): number | null {
  const b0 = b[0] ?? 0;
  const b1 = b[1] ?? 0;
  const b2 = b[2] ?? 0;
  const a1 = a[1] ?? 0;
  const a2 = a[2] ?? 0;
  if (a1 === 0 && a2 === 0) return Math.abs(b0) + Math.abs(b1) + Math.abs(b2);
  const radius = maxPoleRadius([1, a1, a2]);
  if (!(radius < 1)) return null;
  const horizon = radius === 0 ? 3 : 2 * Math.ceil(Math.log(1e-13) / Math.log(radius)) + 10;
  const samples = Math.min(horizon, MAX_IMPULSE_SAMPLES);
  let h1 = 0;
  let h2 = 0;
  let sum = 0;
  let tailMax = 0;
  for (let n = 0; n < samples; n += 1) {
    const input = n === 0 ? b0 : n === 1 ? b1 : n === 2 ? b2 : 0;
    const h = input - a1 * h1 - a2 * h2;
    sum += Math.abs(h);
    if (samples - n <= 100_000) tailMax = Math.max(tailMax, Math.abs(h));
    h2 = h1;
    h1 = h;
  }
  if (samples < horizon) sum += (tailMax * radius) / (1 - radius);
  return sum;
}

/**
 * Resonance of a quantized section: acos(-a1 / (1 + a2)) / (2 pi Ts) with a_i = aq_i / 2^F
 * (CONTRACT section 3, `resonanceHz.fixed`).
 *
 * @param fixed - quantized coefficients.
 * @param samplePeriodS - Ts in seconds.
 * @returns the centre frequency in Hz, or null when the quantized poles are real (no resonance).
 * @example
 * quantizedResonanceHz({ wordBits: 16, fracBits: 14, b: [0, 0, 0], a: [16384, -32764, 16384], qFormat: 'Q2.14' }, 5e-5);
 * // => 49.7359... (the 50 Hz resonator at 20 kHz in Q14)
 */
export function quantizedResonanceHz(fixed: FixedCoefficients, samplePeriodS: number): number | null {
  const a = fixed.a.map((c) => scaleByPowerOfTwo(c, -fixed.fracBits));
  return resonanceHzFromDenominator([1, a[1] / a[0], a[2] / a[0]], samplePeriodS);
}

/**
 * Fixed-point properties of one quantized section (DF-I reference arithmetic, see FIXED_ARITHMETIC).
 *
 * - `dcGain`: H(1) = sum(b) / sum(a) from the double and from the integer coefficients (the 2^F
 *   cancels); null where sum(a) = 0 (pole at z = 1: PI integrators, a low-pass whose
 *   quantized poles reached z = 1).
 * - `maxPoleRadiusFixed`: largest |root| of aq0 z^2 + aq1 z + aq2.
 * - `outputL1Norm`: l1 norm of the quantized section's impulse response (worst-case output for
 *   a unit-peak input; Oppenheim & Schafer, scaling); null when a pole is on or outside the unit
 *   circle — ideal resonators (a2 = 1, marginally stable) and PI integrators, whose states need
 *   saturation and anti-windup.
 * - `headroomBits`: max(0, ceil(log2(l1))) integer bits the output needs beyond the W-bit word
 *   for a full-scale input; null when unbounded. In Direct Form I the states are the two past
 *   inputs (within the word by construction) and the two past outputs, so the output norm is also
 *   the state norm.
 * - `deadbandLsb`, recursive sections other than PI: 0.5 * l1 norm of 1/Aq(z), in output LSB.
 *   The DF-I output y = v + e carries one rounding error |e| <= 0.5 LSB per sample and e reaches
 *   the output through 1/A(z), so the output can sit up to that far off the exact-arithmetic
 *   response (Jackson, "On the interaction of roundoff noise and dynamic range in digital
 *   filters", BSTJ 1970; Oppenheim & Schafer, roundoff in recursive structures). For a first-order
 *   section with pole p this is 0.5 / (1 - p), the classic rounding dead band; for a second-order
 *   section with real positive poles it equals the DC stall 0.5 / (1 + a1 + a2).
 *   For `pi` sections it is the integrator dead band in INPUT LSB: with a1 = -1 exactly, the
 *   integrator moves by round(N x / 2^F) per sample for a constant input x, N = bq0 + bq1, so input
 *   errors below 2^(F-1) / N LSB are never integrated. Null for non-recursive sections, unbounded
 *   error feedback (a pole of Aq on the unit circle) or a lost integral (N <= 0); `notes` says which.
 * - `lostCoefficients`: `b0`..`a2` whose double is non-zero and whose integer is 0.
 *
 * @param section - the double-precision section.
 * @param fixed - its quantized coefficients.
 * @param samplePeriodS - Ts in seconds (> 0).
 * @returns the analysis.
 * @example
 * analyzeFixedSection({ role: 'low-pass', kind: 'low-pass', b: [0.0015683, 0.0015683, 0], a: [1, -0.9968633, 0], prewarpHz: 10 },
 *   quantizeSection([0.0015683, 0.0015683, 0], [1, -0.9968633, 0], 16), 5e-5).deadbandLsb; // => about 160
 */
export function analyzeFixedSection(section: SectionForFixedAnalysis, fixed: FixedCoefficients, samplePeriodS: number): FixedSectionAnalysis {
  if (!(samplePeriodS > 0) || !Number.isFinite(samplePeriodS)) throw new RangeError(`samplePeriodS must be positive and finite, got ${samplePeriodS}`);
  const notes: string[] = [];
  const bq = fixed.b.map((c) => scaleByPowerOfTwo(c, -fixed.fracBits));
  const aqRaw = fixed.a.map((c) => scaleByPowerOfTwo(c, -fixed.fracBits));
  const aq = [1, aqRaw[1] / aqRaw[0], aqRaw[2] / aqRaw[0]];
  const bqNorm = bq.map((c) => c / aqRaw[0]);

  const sum = (v: readonly number[]): number => v.reduce((s, c) => s + c, 0);
  const sumADouble = sum(section.a);
  const sumAInt = sum(fixed.a);
  const dcGain = {
    discrete: sumADouble === 0 ? null : sum(section.b) / sumADouble,
    fixed: sumAInt === 0 ? null : sum(fixed.b) / sumAInt,
  };

  const maxPoleRadiusFixed = maxPoleRadius(aq);
  const outputL1Norm = impulseResponseL1Norm(bqNorm, aq);
  if (outputL1Norm === null) notes.push('outputL1Norm: a quantized pole lies on or outside the unit circle, the state is unbounded: saturate it and add anti-windup');
  const headroomBits = outputL1Norm === null ? null : outputL1Norm <= 1 ? 0 : Math.ceil(Math.log2(outputL1Norm));

  const recursive = fixed.a[1] !== 0 || fixed.a[2] !== 0;
  let deadbandLsb: number | null = null;
  if (!recursive) {
    notes.push('deadbandLsb: not recursive, the output error is at most 0.5 LSB');
  } else if (section.kind === 'pi') {
    const integral = fixed.b[0] + fixed.b[1];
    if (integral > 0) deadbandLsb = 2 ** (fixed.fracBits - 1) / integral;
    else notes.push('deadbandLsb: bq0 + bq1 <= 0, the integral action is lost');
  } else {
    const errorNorm = impulseResponseL1Norm([1], aq);
    if (errorNorm === null) notes.push('deadbandLsb: rounding errors are fed back through a pole on the unit circle and accumulate without bound');
    else deadbandLsb = 0.5 * errorNorm;
  }

  const names = ['b0', 'b1', 'b2', 'a0', 'a1', 'a2'];
  const doubles = [...padded(section.b), ...padded(section.a)];
  const integers = [...fixed.b, ...fixed.a];
  const lostCoefficients = names.filter((_, i) => doubles[i] !== 0 && integers[i] === 0);

  return { dcGain, maxPoleRadiusFixed, outputL1Norm, headroomBits, deadbandLsb, lostCoefficients, notes };
}

/**
 * Fixed-point properties of a quantized delta-operator section (the quantization-robust form,
 * deltaOperator.ts), in the same terms as {@link analyzeFixedSection}.
 *
 * - `dcGain.fixed` = d2 / c2 of the integers' values (H(z = 1) = H(delta = 0)); `discrete` from the doubles.
 * - `maxPoleRadiusFixed`, `outputL1Norm`, `headroomBits`: of the Direct Form I section the quantized
 *   delta coefficients stand for (`directFormFromDelta`).
 * - `deadbandLsb`: 0.5 + 2 * 2^-G * l1(1/Aq). The output rounding (0.5 LSB) does not stay in the
 *   states; the four products entering the accumulators are each rounded to 2^-G LSB (at most
 *   0.5 * 2^-G each) and reach the output through 1/A(z) (Jackson, BSTJ 1970). A steady input
 *   therefore leaves the output within that bound of the exact response: with G = 25 the 10 Hz
 *   Butterworth low-pass at 20 kHz, which stalls 2e5 LSB off in Direct Form I, stays within 0.52 LSB.
 *   Null when a quantized pole lies on the unit circle (ideal resonators; `notes` says so).
 * - `lostCoefficients`: `b0`, `d1`, `d2`, `c1`, `c2` whose double is non-zero and whose integer is 0.
 *
 * @param coefficients - double [b0, d1, d2, c1, c2] (scaled).
 * @param fixed - their quantization.
 * @returns the analysis.
 * @example
 * analyzeDeltaSection(taps, quantizeDelta(taps, 16)).dcGain.fixed; // => 1 for a unity-gain low-pass (d2 and c2 quantize alike)
 */
export function analyzeDeltaSection(coefficients: readonly number[], fixed: DeltaFixedCoefficients): FixedSectionAnalysis {
  const notes: string[] = [];
  const q = dequantizeDelta(fixed);
  const equivalent = directFormFromDelta(q);
  const dcGain = {
    discrete: coefficients[4] === 0 ? null : coefficients[2] / coefficients[4],
    fixed: q[4] === 0 ? null : q[2] / q[4],
  };
  const maxPoleRadiusFixed = maxPoleRadius(equivalent.a);
  const outputL1Norm = impulseResponseL1Norm(equivalent.b, equivalent.a);
  if (outputL1Norm === null) notes.push('outputL1Norm: a quantized pole lies on or outside the unit circle, the state is unbounded: saturate it and add anti-windup');
  const headroomBits = outputL1Norm === null ? null : outputL1Norm <= 1 ? 0 : Math.ceil(Math.log2(outputL1Norm));
  const errorNorm = impulseResponseL1Norm([1], equivalent.a);
  let deadbandLsb: number | null = null;
  if (errorNorm === null) notes.push('deadbandLsb: the accumulators feed rounding errors through a pole on the unit circle');
  else deadbandLsb = 0.5 + 2 * 2 ** -fixed.guardBits * errorNorm;
  const lostCoefficients = DELTA_COEFFICIENT_NAMES.filter((_, i) => coefficients[i] !== 0 && fixed.codes[i] === 0);
  return { dcGain, maxPoleRadiusFixed, outputL1Norm, headroomBits, deadbandLsb, lostCoefficients: [...lostCoefficients], notes };
}

/**
 * Drift limit in Hz of a resonant section: damped resonator 0.1 x its half-bandwidth, ideal
 * resonator 0.01 Hz, SOGI tan(1 deg) x its half-bandwidth (see the constants above).
 *
 * @param section - the section (kind and double denominator).
 * @param samplePeriodS - Ts in seconds.
 * @returns `{ limitHz, basis }` with the basis in words.
 * @example
 * resonanceDriftLimit({ kind: 'resonator', a: [1, -1.999753264963321, 1] }, 5e-5); // => { limitHz: 0.01, basis: 'the ideal-resonator limit' }
 */
export function resonanceDriftLimit(section: Pick<SectionResult, 'kind' | 'a'>, samplePeriodS: number): { limitHz: number; basis: string } {
  const halfBandwidthHz = resonatorHalfBandwidthHz(section.a, samplePeriodS);
  if (section.kind !== 'resonator') return { limitHz: SOGI_DRIFT_FRACTION_OF_HALF_BANDWIDTH * halfBandwidthHz, basis: 'tan(1 deg) x the SOGI half-bandwidth' };
  if (halfBandwidthHz > 0) return { limitHz: RESONATOR_DRIFT_FRACTION_OF_HALF_BANDWIDTH * halfBandwidthHz, basis: '0.1 x the resonator half-bandwidth' };
  return { limitHz: IDEAL_RESONATOR_DRIFT_LIMIT_HZ, basis: 'the ideal-resonator limit' };
}

/**
 * Id of the drift finding of a resonant section: `pr-h<h>-quantization-drift`,
 * `sogi-quantization-drift`, or `<prefix>-quantization-drift`.
 *
 * @param role - section role.
 * @param kind - section kind.
 * @param prefix - `<block id>` or `<block id>-<role>`.
 * @returns the id.
 * @example
 * driftCheckId('resonant-h3', 'resonator', 'current-pr-resonant-h3'); // => 'pr-h3-quantization-drift'
 */
export function driftCheckId(role: string, kind: SectionKind, prefix: string): string {
  if (kind !== 'resonator') return 'sogi-quantization-drift';
  const harmonic = /^resonant-h(\d+)$/.exec(role)?.[1];
  return harmonic ? `pr-h${harmonic}-quantization-drift` : `${prefix}-quantization-drift`;
}

/**
 * Joins remedies into one sentence, dropping the absent ones: `a, or b.` with a capital first letter.
 *
 * @param parts - remedies (null = not applicable).
 * @returns the sentence.
 * @example
 * joinRemedies(['choose 32-bit words', null, 'a wider resonator']); // => 'Choose 32-bit words, or a wider resonator.'
 */
export function joinRemedies(parts: readonly (string | null)[]): string {
  const list = parts.filter((p): p is string => p !== null);
  const text = list.join(', or ');
  return text.charAt(0).toUpperCase() + text.slice(1) + '.';
}

/** What {@link resonanceDriftCheck} needs. */
export interface DriftCheckInput {
  section: Pick<SectionResult, 'kind' | 'role' | 'a' | 'prewarpHz' | 'resonanceHz'>;
  blockId: BlockResult['id'];
  /** `<block id>` or `<block id>-<role>` (check ids). */
  prefix: string;
  /** The section in words. */
  where: string;
  samplePeriodS: number;
  /** Where the section resonates in the arithmetic of the set (null: its poles turned real). */
  landedHz: number | null;
  /** In which arithmetic, e.g. `in Q2.14`, `with binary32 coefficients (Direct Form I)`. */
  how: string;
  /** What turned real, e.g. `the quantized poles`. */
  rounded: string;
  /** Remedies of the arithmetic (null = not applicable); a wider band-pass is always added. */
  remedies: (string | null)[];
}

/**
 * The resonance-drift finding of one resonator or SOGI section (id from {@link driftCheckId}, limit
 * from {@link resonanceDriftLimit}): `error` when the resonance moved more than its limit (or has
 * none), `info` with the drift otherwise.
 *
 * @param p - the section, where it lands, in which arithmetic, and the remedies.
 * @returns the check (value = drift in Hz).
 * @example
 * resonanceDriftCheck({ section, blockId: 'current-pr', prefix: 'current-pr-resonant-h1', where: 'h1', samplePeriodS: 5e-5, landedHz: 49.74, how: 'in Q2.14', rounded: 'the quantized poles', remedies: [] }).severity; // => 'error'
 */
export function resonanceDriftCheck(p: DriftCheckInput): Check {
  const { limitHz, basis } = resonanceDriftLimit(p.section, p.samplePeriodS);
  const designHz = p.section.resonanceHz?.design ?? p.section.prewarpHz;
  const widen = p.section.kind === 'resonator' ? 'a wider resonator (a larger resonant bandwidth)' : 'a larger SOGI gain (wider band-pass)';
  const remedy = joinRemedies([...p.remedies, widen]);
  const base = { id: driftCheckId(p.section.role, p.section.kind, p.prefix), blockId: p.blockId, limit: finiteOrNull(limitHz), unit: 'Hz' };
  if (designHz === null || designHz === undefined) {
    return { ...base, severity: 'error', message: `${p.where}: no design frequency known for this resonant section.`, value: null, remedy };
  }
  if (p.landedHz === null) {
    return { ...base, severity: 'error', message: `${p.where}: ${p.rounded} ${p.how} are real, the section no longer resonates at ${fmt(designHz)} Hz.`, value: null, remedy };
  }
  const drift = Math.abs(p.landedHz - designHz);
  const bad = drift > limitHz;
  return {
    ...base,
    severity: bad ? 'error' : 'info',
    message: bad
      ? `${p.where}: ${p.how} the resonance lands at ${fmt(p.landedHz)} Hz instead of ${fmt(designHz)} Hz (drift ${fmt(drift)} Hz > ${fmt(limitHz)} Hz, ${basis}); the controller loses its gain at the design frequency.`
      : `${p.where}: resonance ${p.landedHz.toPrecision(10)} Hz ${p.how}, drift ${fmt(drift)} Hz within ${fmt(limitHz)} Hz (${basis}).`,
    value: finiteOrNull(drift),
    remedy: bad ? remedy : null,
  };
}

/**
 * The SOGI has two sections sharing one denominator; one drift finding is kept, the one furthest beyond its limit.
 *
 * @param worst - the worst so far (null at first).
 * @param check - a SOGI section's drift check.
 * @returns the worse of the two.
 * @example
 * worst = keepWorstSogi(worst, check);
 */
export function keepWorstSogi(worst: { check: Check; excess: number } | null, check: Check): { check: Check; excess: number } {
  const excess = check.value === null ? Infinity : check.value - (check.limit ?? 0);
  return worst === null || excess > worst.excess ? { check, excess } : worst;
}

/** Remedy naming the quantization-robust structure (what Varsmith produces for resonators, SOGI and low-passes). */
export const ROBUST_STRUCTURE_REMEDY = 'choose the quantization-robust structure (delta-operator sections with their own coefficient scaling)';

/** Remedy naming the 32-bit word. */
export const WORD_REMEDY = 'choose the 32-bit word size';

/** Context of the fixed-point checks. */
export interface FixedPointCheckContext {
  /** Ts in seconds. */
  samplePeriodS: number;
  /** Word length W of the design (16 or 32). */
  wordBits: number;
  /** Grid frequency in Hz. */
  gridFrequencyHz: number;
}

/**
 * Drift limit of a damped resonator, as a fraction of its half-bandwidth. A band-pass resonance off
 * by Delta loses gain 1 / sqrt(1 + (Delta / fb)^2) and gains phase atan(Delta / fb) at the design
 * frequency (second-order band-pass, Teodorescu et al., IEE Proc. EPA 2006, PR gain at the
 * resonance); 0.1 keeps the gain within 0.5 % and the phase within 5.7 degrees. A drift of the
 * order of fb loses the zero-steady-state-error property (Harnefors, IEEE TIE 2009; Yepes et al.,
 * IEEE TPEL 2010).
 */
export const RESONATOR_DRIFT_FRACTION_OF_HALF_BANDWIDTH = 0.1;

/**
 * Drift limit in Hz of an ideal resonator (no bandwidth to absorb a drift): 0.01 Hz, the accuracy
 * that needs 23/25/27-bit words at 10/20/40 kHz for 50 Hz (Harnefors, IEEE TIE 2009, coefficient
 * sensitivity near z = 1).
 */
export const IDEAL_RESONATOR_DRIFT_LIMIT_HZ = 0.01;

/**
 * SOGI drift limit as tan(1 degree) times the SOGI half-bandwidth k f0 / 2: the band-pass output's
 * phase at the grid frequency moves by atan(Delta / fb), and the PLL locks onto that phase
 * (Ciobotaru, Teodorescu, Blaabjerg, PESC 2006). One degree of angle error is the limit chosen here
 * (engineering limit, no source).
 */
export const SOGI_DRIFT_FRACTION_OF_HALF_BANDWIDTH = Math.tan(Math.PI / 180);

/** Relative DC-gain error of a quantized low-pass beyond which a warning is raised (1 %, common practice, no source). */
export const LOW_PASS_DC_GAIN_TOLERANCE = 0.01;

/** Relative error of the quantized integral gain bq0 + bq1 beyond which a warning is raised (1 %, common practice, no source). */
export const INTEGRAL_GAIN_TOLERANCE = 0.01;

/** Dead band, as a fraction of full scale, beyond which a warning is raised (0.1 %, common practice, no source). */
export const DEADBAND_FRACTION_OF_FULL_SCALE = 0.001;

/**
 * Half-bandwidth in Hz of a resonant section from its double pole radius: poles r e^{+-j theta}
 * with r^2 = a2 come from s = -sigma +- j omega with r = e^{-sigma Ts} (pole mapping, exact for
 * impulse invariance; prewarped Tustin scales sigma by about 1 - (omega0 Ts)^2 / 12, 2e-5 relative
 * for 50 Hz at 20 kHz), and the -3 dB half-bandwidth of the band-pass is sigma.
 *
 * @param a - denominator [1, a1, a2] of the double section.
 * @param samplePeriodS - Ts in seconds.
 * @returns half-bandwidth in Hz (0 for an ideal resonator, a2 = 1).
 * @example
 * resonatorHalfBandwidthHz([1, -1.999253472149031, 0.999500145519904], 5e-5); // => 0.7957 (5 rad/s)
 */
export function resonatorHalfBandwidthHz(a: readonly number[], samplePeriodS: number): number {
  const a2 = a[2] ?? 0;
  if (!(a2 > 0) || a2 >= 1) return 0;
  return -Math.log(a2) / (4 * Math.PI * samplePeriodS);
}

/**
 * Fixed-point checks over all blocks. Ids are `<prefix>-<finding>`, prefix = the block id, or
 * `<block id>-<role>` for blocks with several sections; the resonance drifts use
 * `pr-h<h>-quantization-drift` and `sogi-quantization-drift` (worst SOGI section). Sections in the
 * delta-operator form (`section.delta`) are checked on their own integers.
 *
 * - resonance drift |fixed - design| (resonators, SOGI): `error` above the limit (damped resonator:
 *   0.1 x half-bandwidth; ideal: 0.01 Hz; SOGI: tan(1 deg) x half-bandwidth), `info` otherwise.
 * - a low-pass whose integers give aq0 + aq1 + aq2 <= 0 (delta form: c2 <= 0; a pole at or past z = 1): `error`.
 * - any other section whose quantized poles reach the unit circle while the double ones do not: `error`.
 * - lost coefficient (non-zero double, zero integer): `error`.
 * - PI: integral gain bq0 + bq1 zero or of the wrong sign: `error`; off by more than 1 %: `warning`;
 *   integrator dead band (input errors never integrated) above 0.1 % of full scale: `warning`.
 * - low-pass / SOGI low-pass DC gain off by more than 1 %: `warning`.
 * - output dead band above 0.1 % of full scale: `warning`.
 * - F < 0 (coefficients beyond the word even without fraction bits; delta form: also G < 0): `error`.
 * - unbounded state (ideal resonators, integrators): `info` (the limited steps of the set bound them);
 *   output needing more bits than the word for a full-scale input: `info`.
 *
 * Remedies name only what Varsmith produces: 32-bit words, the quantization-robust structure,
 * the limited PI step (its integrator keeps guard bits), and design inputs (bandwidth, SOGI gain, cutoff).
 *
 * @param blocks - blocks whose sections carry `fixed`, and optionally `resonanceHz`, `delta` and
 *   `fixedAnalysis` (computed here when absent).
 * @param context - sampling period, word length and grid frequency.
 * @returns the checks, in block and section order.
 * @example
 * fixedPointChecks(analysis.blocks, { samplePeriodS: 5e-5, wordBits: 16, gridFrequencyHz: 50 })
 *   .find((c) => c.id === 'pr-h1-quantization-drift'); // => { severity: 'error', value: 0.264, limit: 0.05, unit: 'Hz', ... }
 */
export function fixedPointChecks(blocks: readonly BlockResult[], context: FixedPointCheckContext): Check[] {
  const checks: Check[] = [];
  const ts = context.samplePeriodS;
  const fullScale = 2 ** (context.wordBits - 1) - 1;
  const wordRemedy = context.wordBits < 32 ? WORD_REMEDY : null;
  let worstSogi: { check: Check; excess: number } | null = null;

  for (const block of blocks) {
    for (const section of block.sections) {
      const fixed = section.fixed;
      const delta = section.delta?.fixed ?? null;
      const robustRemedy = delta === null && section.kind !== 'gain' && section.kind !== 'pi' ? ROBUST_STRUCTURE_REMEDY : null;
      const format = delta === null ? fixed.qFormat : `the delta-operator form (${delta.qFormats.join(', ')}, G = ${delta.guardBits})`;
      const prefix = block.sections.length > 1 ? `${block.id}-${section.role}` : block.id;
      const where = sectionName(block.id, section.role, block.sections.length);
      const make = (id: string, severity: Check['severity'], message: string, value: number | null, limit: number | null, unit: string | null, remedy: string | null): Check => ({
        id, severity, message, value: finiteOrNull(value), limit: finiteOrNull(limit), unit, blockId: block.id, remedy,
      });

      const minFrac = delta === null ? fixed.fracBits : Math.min(delta.guardBits, ...delta.fracBits);
      if (minFrac < 0) {
        checks.push(make(`${prefix}-coefficient-range`, 'error', `${where}: coefficients exceed the ${fixed.wordBits}-bit word even with no fraction bits (F = ${minFrac}); the reference arithmetic cannot run it.`, minFrac, 0, 'bit', joinRemedies([wordRemedy, 'per-unit signals (they keep every gain near 1)'])));
        continue;
      }
      const fa = section.fixedAnalysis ?? (section.delta ? analyzeDeltaSection(section.delta.coefficients, section.delta.fixed) : analyzeFixedSection(section, fixed, ts));

      if (fa.lostCoefficients.length > 0) {
        checks.push(make(`${prefix}-lost-coefficient`, 'error', `${where}: ${fa.lostCoefficients.join(', ')} quantize to zero in ${format}; the section no longer does what it was designed for.`, fa.lostCoefficients.length, 0, 'coefficients', joinRemedies([robustRemedy, wordRemedy, 'float32 arithmetic'])));
      }

      if (section.kind === 'resonator' || section.kind === 'sogi-band-pass' || section.kind === 'sogi-low-pass') {
        const check = resonanceDriftCheck({
          section, blockId: block.id, prefix, where, samplePeriodS: ts, how: `in ${format}`, rounded: 'the quantized poles',
          landedHz: section.resonanceHz ? section.resonanceHz.fixed : quantizedResonanceHz(fixed, ts), remedies: [robustRemedy, wordRemedy],
        });
        const isSogi = section.kind !== 'resonator';
        if (isSogi) worstSogi = keepWorstSogi(worstSogi, check);
        else checks.push(check);
      }

      const sumInt = delta === null ? fixed.a[0] + fixed.a[1] + fixed.a[2] : delta.codes[4];
      const doubleRadius = maxPoleRadius(section.a);
      if (section.kind === 'low-pass' && sumInt <= 0) {
        const what = delta === null ? `1 + a1 + a2 quantizes to ${sumInt} LSB of ${fixed.qFormat}` : `c2 = 1 + a1 + a2 quantizes to ${sumInt}`;
        checks.push(make(`${prefix}-pole-at-one`, 'error', `${where}: ${what}; a pole sits at or beyond z = 1 and the low-pass becomes an integrator.`, sumInt, 1, 'LSB', joinRemedies([robustRemedy, wordRemedy, 'a higher cutoff frequency'])));
      } else if (fa.maxPoleRadiusFixed >= 1 && doubleRadius < 1) {
        checks.push(make(`${prefix}-quantized-unstable`, 'error', `${where}: the quantized poles have radius ${fmt(fa.maxPoleRadiusFixed)} (double ${fmt(doubleRadius)}); the section is no longer stable in ${format}.`, fa.maxPoleRadiusFixed, 1, null, joinRemedies([robustRemedy, wordRemedy])));
      }

      if (section.kind === 'pi') {
        const b = section.scaled?.b ?? section.b;
        const intended = scaleByPowerOfTwo((b[0] ?? 0) + (b[1] ?? 0), fixed.fracBits);
        const integral = fixed.b[0] + fixed.b[1];
        const remedy = joinRemedies([wordRemedy, 'run the limited PI step of the set (its integrator keeps guard bits below the signal LSB)']);
        if (intended !== 0) {
          if (integral === 0 || Math.sign(integral) !== Math.sign(intended)) {
            checks.push(make(`${prefix}-integral-lost`, 'error', `${where}: the integral gain ki*Ts = b0 + b1 (${fmt(intended)} LSB) quantizes to ${integral} LSB in ${fixed.qFormat}; the integral action is lost.`, integral, 1, 'LSB', remedy));
          } else {
            const relative = Math.abs(integral - intended) / Math.abs(intended);
            if (relative > INTEGRAL_GAIN_TOLERANCE) {
              checks.push(make(`${prefix}-integral-gain-error`, 'warning', `${where}: the integral gain quantizes to ${integral} LSB instead of ${fmt(intended)} (${fmt(100 * relative)} % off).`, 100 * relative, 100 * INTEGRAL_GAIN_TOLERANCE, '%', remedy));
            }
            const integralLimit = DEADBAND_FRACTION_OF_FULL_SCALE * fullScale;
            if (fa.deadbandLsb !== null && fa.deadbandLsb > integralLimit) {
              checks.push(make(`${prefix}-integral-deadband`, 'warning', `${where}: input errors below ${fmt(fa.deadbandLsb)} LSB (${fmt((100 * fa.deadbandLsb) / fullScale)} % of full scale) are never integrated: the integrator increment round(ki*Ts*x) stays 0.`, fa.deadbandLsb, integralLimit, 'LSB', remedy));
            }
          }
        }
      }

      if ((section.kind === 'low-pass' || section.kind === 'sogi-low-pass') && fa.dcGain.discrete !== null && fa.dcGain.fixed !== null && fa.dcGain.discrete !== 0) {
        const relative = Math.abs(fa.dcGain.fixed - fa.dcGain.discrete) / Math.abs(fa.dcGain.discrete);
        if (relative > LOW_PASS_DC_GAIN_TOLERANCE) {
          checks.push(make(`${prefix}-dc-gain-error`, 'warning', `${where}: the quantized DC gain is ${fmt(fa.dcGain.fixed)} instead of ${fmt(fa.dcGain.discrete)} (${fmt(100 * relative)} % off).`, 100 * relative, 100 * LOW_PASS_DC_GAIN_TOLERANCE, '%', joinRemedies([robustRemedy, wordRemedy])));
        }
      }

      const deadbandLimit = DEADBAND_FRACTION_OF_FULL_SCALE * fullScale;
      if (section.kind !== 'pi' && fa.deadbandLsb !== null && fa.deadbandLsb > deadbandLimit) {
        checks.push(make(`${prefix}-deadband`, 'warning', `${where}: rounding can hold the output up to ${fmt(fa.deadbandLsb)} LSB (${fmt((100 * fa.deadbandLsb) / fullScale)} % of full scale) off its exact value.`, fa.deadbandLsb, deadbandLimit, 'LSB', joinRemedies([robustRemedy, wordRemedy])));
      }

      if (fa.outputL1Norm === null && section.kind !== 'low-pass' && !(fa.maxPoleRadiusFixed >= 1 && doubleRadius < 1)) {
        checks.push(make(`${prefix}-unbounded-state`, 'info', `${where}: a pole on the unit circle (${section.kind === 'pi' ? 'integrator' : 'ideal resonator'}) makes the state unbounded for a sustained input; the limited steps of the set clamp the output and hold the states bounded.`, null, null, null, 'Run the block through its limited step (output clamp with anti-windup).'));
      } else if (fa.headroomBits !== null && fa.headroomBits > 0) {
        checks.push(make(`${prefix}-headroom`, 'info', `${where}: a full-scale input can drive the output ${fa.headroomBits} bit(s) past the word (l1 norm ${fmt(fa.outputL1Norm ?? 0)}); the output saturates.`, fa.headroomBits, 0, 'bit', null));
      }
    }
  }
  if (worstSogi !== null) checks.push(worstSogi.check);
  return checks;
}

function padded(v: readonly number[]): number[] {
  return [0, 1, 2].map((i) => v[i] ?? 0);
}

function finiteOrNull(v: number | null): number | null {
  return v !== null && Number.isFinite(v) ? v : null;
}

function fmt(v: number): string {
  if (v === 0) return '0';
  const magnitude = Math.abs(v);
  if (magnitude >= 1e6 || magnitude < 1e-3) return v.toExponential(3);
  return Number(v.toPrecision(6)).toString();
}
