/**
 * The delta-operator form of a second-order section: the quantization-robust structure of
 * CONTRACT section 7 for resonators, SOGI and low-pass sections.
 *
 * Derivation. Write z = 1 + delta (delta = z - 1, the delta operator with step Delta = 1; Middleton
 * & Goodwin, "Digital Control and Estimation: A Unified Approach", 1990, from memory; Newman &
 * Holmes, "Delta operator digital filters for high performance inverter applications", IEEE TPEL
 * 18(1), 2003). A Direct Form I section (b0 + b1 z^-1 + b2 z^-2) / (1 + a1 z^-1 + a2 z^-2) is, after
 * multiplying numerator and denominator by z^2,
 *
 *   (b0 z^2 + b1 z + b2) / (z^2 + a1 z + a2)
 *     = (b0 delta^2 + d1 delta + d2) / (delta^2 + c1 delta + c2),
 *   d1 = 2 b0 + b1,  d2 = b0 + b1 + b2,  c1 = 2 + a1,  c2 = 1 + a1 + a2.
 *
 * Dividing by delta^2 and writing D = 1/delta = z^-1 / (1 - z^-1) (an accumulator with one sample
 * of delay) gives H = (b0 + d1 D + d2 D^2) / (1 + c1 D + c2 D^2), realised as a transposed direct
 * form II with accumulators instead of delays:
 *
 *   y[n]    = b0 x[n] + s1[n]
 *   s1[n+1] = s1[n] + d1 x[n] - c1 y[n] + s2[n]
 *   s2[n+1] = s2[n] + d2 x[n] - c2 y[n]
 *
 * Why it is robust: a resonance at theta = omega Ts has a1 = -2 cos(theta) + O(damping), so in
 * Direct Form I the information sits in the last bits of a1 ~ -2; here c1 and c2 ~ theta^2 are
 * small numbers that each get their own scaling, so a W-bit word holds them to W - 1 significant
 * bits (Harnefors, "Implementation of resonant controllers and filters in fixed-point arithmetic",
 * IEEE TIE 56(4), 2009, on coefficient sensitivity near z = 1). For an ideal resonator c1 = c2 =
 * 4 sin^2(theta / 2), the square of the integrator gain 2 sin(theta / 2) of the two-integrator
 * resonator (Yepes et al., IEEE TPEL 26(2), 2011), and a2 = 1 - c1 + c2 = 1 stays exact whatever
 * the word. For a unity-gain low-pass d2 = c2 = 1 + a1 + a2: the DC gain d2 / c2 is exactly 1
 * after quantization, and the states (accumulators with guard bits) do not stall.
 */
import { maxFracBits, qFormatLabel, roundToInteger, scaleByPowerOfTwo } from './quantize';
import type { DeltaFixedCoefficients } from './types';

/** Delta-operator coefficients [b0, d1, d2, c1, c2] of one section (see the module comment). */
export type DeltaTaps = [number, number, number, number, number];

/** Names of the delta-operator coefficients, in order. */
export const DELTA_COEFFICIENT_NAMES = ['b0', 'd1', 'd2', 'c1', 'c2'] as const;

/**
 * Delta-operator coefficients of a continuous biquad mapped by s = K (z - 1)/(z + 1), without the
 * cancellation of forming 2 + a1 from a1 ~ -2.
 *
 * Method: with L = d2s K^2 + d1s K + d0s (the z^2 coefficient of the mapped denominator,
 * Oppenheim & Schafer, bilinear transformation), the derivation in the module comment gives
 * b0 = (n2 K^2 + n1 K + n0) / L, d1 = (2 n1 K + 4 n0) / L, d2 = 4 n0 / L,
 * c1 = (2 d1s K + 4 d0s) / L, c2 = 4 d0s / L. A first-order pair (n2 = d2s = 0) is mapped as the
 * first-order section that `bilinearBiquad` returns (its common root at z = -1 removed, a pole at
 * z = 0 added by the padding): with M = d1s K + d0s, b0 = (n1 K + n0) / M, d1 = (n1 K + 3 n0) / M,
 * d2 = 2 n0 / M, c1 = (d1s K + 3 d0s) / M, c2 = 2 d0s / M.
 *
 * @param num - [n2, n1, n0], descending powers of s.
 * @param den - [d2s, d1s, d0s], descending powers of s.
 * @param tustinConstant - K in 1/s.
 * @returns [b0, d1, d2, c1, c2] (dimensionless).
 * @example
 * bilinearBiquadDelta([0, 0, 1], [0, 1, 1], 2); // => [1/3, 1, 2/3, 5/3, 2/3] (b = [1/3, 1/3], a1 = -1/3: d1 = 2 b0 + b1, c1 = 2 + a1, c2 = 1 + a1)
 */
export function bilinearBiquadDelta(num: readonly [number, number, number], den: readonly [number, number, number], tustinConstant: number): DeltaTaps {
  const k = tustinConstant;
  if (num[0] === 0 && den[0] === 0) {
    const m = den[1] * k + den[2];
    return [(num[1] * k + num[2]) / m, (num[1] * k + 3 * num[2]) / m, (2 * num[2]) / m, (den[1] * k + 3 * den[2]) / m, (2 * den[2]) / m];
  }
  const lead = den[0] * k * k + den[1] * k + den[2];
  return [
    (num[0] * k * k + num[1] * k + num[2]) / lead,
    (2 * num[1] * k + 4 * num[2]) / lead,
    (4 * num[2]) / lead,
    (2 * den[1] * k + 4 * den[2]) / lead,
    (4 * den[2]) / lead,
  ];
}

/**
 * Delta-operator coefficients of a Direct Form I section, by the plain formulas of the module
 * comment (c1 = 2 + a1 loses the digits that cancel; prefer {@link bilinearBiquadDelta}).
 *
 * @param b - [b0, b1, b2].
 * @param a - [1, a1, a2].
 * @returns [b0, d1, d2, c1, c2].
 * @example
 * deltaFromDirectForm([0.5, 0, 0], [1, -0.5, 0]); // => [0.5, 1, 0.5, 1.5, 0.5]
 */
export function deltaFromDirectForm(b: readonly number[], a: readonly number[]): DeltaTaps {
  const [b0, b1, b2] = [0, 1, 2].map((i) => b[i] ?? 0);
  const a1 = a[1] ?? 0;
  const a2 = a[2] ?? 0;
  return [b0, 2 * b0 + b1, b0 + b1 + b2, 2 + a1, 1 + a1 + a2];
}

/**
 * Direct Form I coefficients of a delta-operator section: b1 = d1 - 2 b0, b2 = d2 - d1 + b0,
 * a1 = c1 - 2, a2 = 1 + (c2 - c1) (the difference first, so c1 = c2 gives a2 = 1 exactly).
 *
 * @param taps - [b0, d1, d2, c1, c2].
 * @returns `{ b: [b0, b1, b2], a: [1, a1, a2] }`.
 * @example
 * directFormFromDelta([0.5, 1, 0.5, 1.5, 0.5]); // => { b: [0.5, 0, 0], a: [1, -0.5, 0] }
 */
export function directFormFromDelta(taps: readonly number[]): { b: number[]; a: number[] } {
  const [b0, d1, d2, c1, c2] = taps;
  return { b: [b0, d1 - 2 * b0, d2 - d1 + b0], a: [1, c1 - 2, 1 + (c2 - c1)] };
}

/**
 * The section with its numerator multiplied by g (CONTRACT section 7): b0, d1, d2 times g.
 *
 * @param taps - [b0, d1, d2, c1, c2].
 * @param gain - g (dimensionless).
 * @returns the scaled taps.
 * @example
 * scaleDeltaNumerator([0.5, 1, 0.5, 1.5, 0.5], 2); // => [1, 2, 1, 1.5, 0.5]
 */
export function scaleDeltaNumerator(taps: readonly number[], gain: number): DeltaTaps {
  return [gain * taps[0], gain * taps[1], gain * taps[2], taps[3], taps[4]];
}

/**
 * Centre frequency of a delta-operator section: the zero-phase frequency of CONTRACT section 3,
 * cos(theta) = -a1 / (1 + a2), written without cancellation: with a1 = c1 - 2 and a2 = 1 - c1 + c2,
 * 1 - cos(theta) = c2 / (2 - c1 + c2), so theta = 2 asin(sqrt(c2 / (2 (2 - c1 + c2)))).
 *
 * @param c1 - 2 + a1.
 * @param c2 - 1 + a1 + a2.
 * @param samplePeriodS - Ts in seconds.
 * @returns Hz, or null when 1 - cos(theta) falls outside [0, 2] (no real centre frequency).
 * @example
 * const c = 4 * Math.sin(Math.PI * 50 * 5e-5) ** 2; // ideal 50 Hz resonator at 20 kHz
 * deltaResonanceHz(c, c, 5e-5); // => 50 (to 1e-12 relative)
 */
export function deltaResonanceHz(c1: number, c2: number, samplePeriodS: number): number | null {
  const denominator = 2 - c1 + c2;
  if (!(denominator !== 0) || !Number.isFinite(c1) || !Number.isFinite(c2)) return null;
  const oneMinusCos = c2 / denominator;
  if (oneMinusCos < 0 || oneMinusCos > 2) return null;
  return (2 * Math.asin(Math.sqrt(oneMinusCos / 2))) / (2 * Math.PI * samplePeriodS);
}

/** Largest guard bits of a state: states stay within 2^57 and every product at state scale within 2^58 (see {@link stateGuardBits}). */
export const GUARD_BITS_STATE_LIMIT = 57;

/**
 * Guard bits G of 64-bit states in units of 2^-G signal LSB, for W-bit signals and coefficients
 * with fraction bits F_k: G = min(57 - W, 60 - 2 W + min F_k).
 *
 * Why: |code| and |signal| are below 2^(W-1), so a product brought to the state scale,
 * code * signal * 2^(G - F_k), is below 2^(2W - 2 + G - F_k) <= 2^58; states held within
 * 2 * 2^(W-1) * 2^G <= 2^57; a state update adds at most two states and two products, below
 * 2^60 < 2^63 - 1, and the rounding constants of right shifts (at most 2^61) never overflow either.
 *
 * @param wordBits - W (2 to 32).
 * @param fracBits - fraction bits of the non-zero coefficients of the section (empty = none).
 * @returns G (may be negative when a coefficient is too large for the form; the caller refuses it).
 * @example
 * stateGuardBits(32, [30, 40, 48]); // => 25
 * stateGuardBits(16, [14, 20]); // => 41
 */
export function stateGuardBits(wordBits: number, fracBits: readonly number[]): number {
  const minF = fracBits.length === 0 ? 62 : Math.min(...fracBits);
  return Math.min(GUARD_BITS_STATE_LIMIT - wordBits, 60 - 2 * wordBits + minF);
}

/**
 * One coefficient quantized on its own: F = largest integer <= 62 with round(c * 2^F) within
 * +-(2^(W-1) - 1) (the CONTRACT section 3 rule applied to a single value), round half away from zero.
 * A zero coefficient gets F = W - 2 and code 0.
 *
 * @param value - the coefficient.
 * @param wordBits - W.
 * @returns `{ code, fracBits }`.
 * @example
 * quantizeOwnScale(2.467e-4, 16); // => { code: 16556, fracBits: 26 }
 */
export function quantizeOwnScale(value: number, wordBits: number): { code: number; fracBits: number } {
  if (value === 0) return { code: 0, fracBits: wordBits - 2 };
  const fracBits = maxFracBits([value], wordBits);
  const code = roundToInteger(scaleByPowerOfTwo(value, fracBits), 'nearest-away');
  return { code: code === 0 ? 0 : code, fracBits };
}

/**
 * Quantizes a delta-operator section: every coefficient on its own scale ({@link quantizeOwnScale}),
 * guard bits from {@link stateGuardBits} over the non-zero coefficients.
 *
 * @param taps - [b0, d1, d2, c1, c2], already scaled to the block's signals.
 * @param wordBits - W (16 or 32 in designs).
 * @returns the integers, their fraction bits and Q formats, and G.
 * @example
 * quantizeDelta([2.4999e-5, 4.9998e-5, 0, 2.4674e-4, 2.4674e-4], 16).fracBits; // => [30, 29, 14, 26, 26]
 */
export function quantizeDelta(taps: readonly number[], wordBits: number): DeltaFixedCoefficients {
  const quantized = taps.map((c) => quantizeOwnScale(c, wordBits));
  const fracBits = quantized.map((q) => q.fracBits);
  return {
    wordBits,
    codes: quantized.map((q) => q.code),
    fracBits,
    qFormats: fracBits.map((f) => qFormatLabel(wordBits, f)),
    guardBits: stateGuardBits(wordBits, quantized.filter((q) => q.code !== 0).map((q) => q.fracBits)),
  };
}

/**
 * The values the quantized delta coefficients stand for: code * 2^-F each.
 *
 * @param fixed - quantized delta coefficients.
 * @returns [b0, d1, d2, c1, c2] as doubles (exact).
 * @example
 * dequantizeDelta({ wordBits: 16, codes: [1, 0, 0, 16384, 8192], fracBits: [14, 14, 14, 14, 14], qFormats: [], guardBits: 41 }); // => [6.103515625e-5, 0, 0, 1, 0.5]
 */
export function dequantizeDelta(fixed: DeltaFixedCoefficients): DeltaTaps {
  const v = fixed.codes.map((c, i) => scaleByPowerOfTwo(c, -fixed.fracBits[i]));
  return [v[0], v[1], v[2], v[3], v[4]];
}
