/**
 * Bit-exact fixed-point model of a delta-operator section (the quantization-robust form; derivation
 * in shared/control/deltaOperator.ts), as the generated C runs it.
 *
 * Per sample, with W-bit signals x, y, 64-bit states s1, s2 in units of 2^-G signal LSB, and
 * coefficient integers k_i with their own fraction bits F_i (i = b0, d1, d2, c1, c2):
 * ```
 * p_i(v) = round(k_i * v * 2^(G - F_i))         (F_i > G: (k_i v + 2^(F_i-G-1)) >> (F_i - G); else exact)
 * y      = clamp((p_b0(x) + s1 + 2^(G-1)) >> G, +-limit)
 * s1    <- clamp(s1 + p_d1(x) - p_c1(y) + s2, +-2 limit 2^G)
 * s2    <- clamp(s2 + p_d2(x) - p_c2(y),      +-2 limit 2^G)
 * ```
 * `>>` is the floor shift (round half up with the added constant). The guard bits G of
 * `stateGuardBits` keep every product below 2^58 and every state below 2^57, so no partial sum
 * can overflow int64 (the model checks the rule on the coefficients, once).
 */
import { stateGuardBits, type DeltaFixedCoefficients } from '../control/index';
import { FixedArithmeticError, signalMax } from './fixedModel';

/** State of a delta-operator section: two accumulators with G guard bits. */
export interface DeltaSectionState {
  readonly form: 'delta-operator';
  readonly fixed: DeltaFixedCoefficients;
  s1: bigint;
  s2: bigint;
  sampleIndex: number;
  /** 2^(W-1) - 1. */
  readonly signalMax: number;
  /** Coefficient integers as bigint. */
  readonly codes: readonly bigint[];
  /** F_i - G of every coefficient (positive: right shift with rounding; negative: exact left shift). */
  readonly shifts: readonly number[];
}

/**
 * round(v / 2^shift) with ties towards +infinity for shift > 0 (floor((v + 2^(shift-1)) / 2^shift)),
 * v for shift = 0, and the exact v * 2^-shift for shift < 0: the `round_shift` of the C source.
 *
 * @param value - integer (bigint).
 * @param shift - integer shift.
 * @returns the shifted integer.
 * @example
 * roundShift(-3n, 1); // => -1n (-1.5 rounds up)
 * roundShift(5n, -2); // => 20n
 */
export function roundShift(value: bigint, shift: number): bigint {
  if (shift > 0) return (value + (1n << BigInt(shift - 1))) >> BigInt(shift);
  if (shift < 0) return value << BigInt(-shift);
  return value;
}

/**
 * Checks that quantized delta coefficients can run in the model: W an integer in [2, 32], five
 * integers within +-(2^(W-1) - 1), fraction bits integers in [0, 62], and G the value of
 * `stateGuardBits` (so the overflow argument holds) and at least 0.
 *
 * @param fixed - quantized delta coefficients.
 * @returns nothing.
 * @throws FixedArithmeticError naming the rule broken.
 * @example
 * validateDeltaCoefficients(section.delta.fixed);
 */
export function validateDeltaCoefficients(fixed: DeltaFixedCoefficients): void {
  const { wordBits, codes, fracBits, guardBits } = fixed;
  if (!Number.isInteger(wordBits) || wordBits < 2 || wordBits > 32) throw new FixedArithmeticError('invalid-coefficients', `wordBits must be an integer in [2, 32], got ${wordBits}`);
  if (codes.length !== 5 || fracBits.length !== 5) throw new FixedArithmeticError('invalid-coefficients', `a delta section needs five integers and five fraction-bit counts, got ${codes.length} and ${fracBits.length}`);
  const max = signalMax(wordBits);
  codes.forEach((c, i) => {
    if (!Number.isInteger(c) || Math.abs(c) > max) throw new FixedArithmeticError('invalid-coefficients', `coefficient ${i} must be an integer within +-${max}, got ${c}`);
    if (!Number.isInteger(fracBits[i]) || fracBits[i] < 0 || fracBits[i] > 62) throw new FixedArithmeticError('invalid-coefficients', `fraction bits ${i} must be an integer in [0, 62], got ${fracBits[i]}`);
  });
  const expected = stateGuardBits(wordBits, fracBits.filter((_, i) => codes[i] !== 0));
  if (guardBits !== expected || guardBits < 0) throw new FixedArithmeticError('invalid-coefficients', `guard bits must be ${expected} (and at least 0) for these coefficients, got ${guardBits}`);
}

/**
 * Reset state of a delta-operator section (both accumulators zero).
 *
 * @param fixed - quantized delta coefficients (validated here).
 * @returns the state.
 * @example
 * const state = createDeltaSectionState(section.delta.fixed);
 */
export function createDeltaSectionState(fixed: DeltaFixedCoefficients): DeltaSectionState {
  validateDeltaCoefficients(fixed);
  return {
    form: 'delta-operator',
    fixed,
    s1: 0n,
    s2: 0n,
    sampleIndex: 0,
    signalMax: signalMax(fixed.wordBits),
    codes: fixed.codes.map(BigInt),
    shifts: fixed.fracBits.map((f) => f - fixed.guardBits),
  };
}

/**
 * Clears both accumulators.
 *
 * @param state - the state (mutated).
 * @returns nothing.
 * @example
 * resetDeltaSectionState(state); // state.s1 === 0n
 */
export function resetDeltaSectionState(state: DeltaSectionState): void {
  state.s1 = 0n;
  state.s2 = 0n;
  state.sampleIndex = 0;
}

/**
 * One sample of the delta-operator section (rules in the module comment).
 *
 * @param state - section state (mutated).
 * @param input - x[n], an integer within +-(2^(W-1) - 1) (input LSB).
 * @param limit - output clamp, integer in [0, 2^(W-1) - 1] (default the word's maximum); the
 *   accumulators are held within +-2 limit 2^G.
 * @returns y[n] (output LSB).
 * @throws FixedArithmeticError for an input or limit outside the word.
 * @example
 * stepDeltaSection(createDeltaSectionState(lowPass16), 1000); // => the first output sample
 */
export function stepDeltaSection(state: DeltaSectionState, input: number, limit: number = state.signalMax): number {
  const word = state.signalMax;
  if (!Number.isInteger(input) || Math.abs(input) > word) throw new FixedArithmeticError('invalid-input', `input sample ${state.sampleIndex} must be an integer within +-${word}, got ${input}`);
  if (!Number.isInteger(limit) || limit < 0 || limit > word) throw new FixedArithmeticError('invalid-input', `limit must be an integer in [0, ${word}], got ${limit}`);
  const g = state.fixed.guardBits;
  const k = state.codes;
  const sh = state.shifts;
  const x = BigInt(input);
  const lim = BigInt(limit);
  const raw = roundShift(roundShift(k[0] * x, sh[0]) + state.s1, g);
  const yb = raw > lim ? lim : raw < -lim ? -lim : raw;
  const bound = (2n * lim) << BigInt(g);
  const clampState = (v: bigint): bigint => (v > bound ? bound : v < -bound ? -bound : v);
  const s1 = clampState(state.s1 + roundShift(k[1] * x, sh[1]) - roundShift(k[3] * yb, sh[3]) + state.s2);
  state.s2 = clampState(state.s2 + roundShift(k[2] * x, sh[2]) - roundShift(k[4] * yb, sh[4]));
  state.s1 = s1;
  state.sampleIndex += 1;
  return Number(yb);
}
