import type { FixedCoefficients } from '../control/index';

/**
 * The reference fixed-point arithmetic of CONTRACT section 3, as data, so the exported C source,
 * the report and this model state the same rules (the Export templates print these fields).
 *
 * Per sample, for a section with integers bq[0..2], aq[0..2] (aq[0] = 2^F) and fraction bits F:
 * ```
 * acc  = bq0*x[n] + bq1*x[n-1] + bq2*x[n-2] - aq1*y[n-1] - aq2*y[n-2]     (exact, 64-bit)
 * y[n] = sat_W((acc + 2^(F-1)) >> F)                                      (>> is arithmetic: floor)
 * ```
 * - Signals x and y are W-bit integers within the symmetric range [-(2^(W-1) - 1), 2^(W-1) - 1];
 *   saturation clamps to that range, so -2^(W-1) never occurs and negation never overflows.
 * - Rounding: adding 2^(F-1) before the floor shift is round-half-up (ties towards +infinity);
 *   with F = 0 the rounding constant is 0 (no shift). F < 0 is refused.
 * - Accumulator: signed 64-bit. Signed overflow is undefined behaviour in C, so nothing relies on
 *   wrap-around: the model throws {@link AccumulatorOverflowError} for any sample where
 *   |bq0*x0| + |bq1*x1| + |bq2*x2| + |aq1*y1| + |aq2*y2| + 2^(F-1) > 2^63 - 1, which guarantees
 *   that every partial sum in any summation order fits int64. Golden vectors are built so that
 *   this bound holds for every possible output, hence also in the C code.
 * - Block: the output of a block of parallel sections is sat_W(sum of the section outputs), each
 *   section output saturated first; the sum is formed in 64 bits (at most a few W-bit terms).
 * - State after reset: x[n-1] = x[n-2] = y[n-1] = y[n-2] = 0. The stored y is the saturated output.
 */
export const FIXED_ARITHMETIC = {
  structure: 'direct-form-1',
  accumulatorBits: 64,
  /** Saturation bounds of a W-bit signal, as a function of W. */
  saturation: 'symmetric',
  saturationMaxFormula: '2^(W-1) - 1',
  saturationMinFormula: '-(2^(W-1) - 1)',
  roundingConstantFormula: '2^(F-1) for F >= 1, 0 for F = 0',
  shift: 'arithmetic right shift by F (floor division by 2^F)',
  rounding: 'half-up (ties towards +infinity)',
  accumulatorOverflow: 'never occurs: |b0 x0| + |b1 x1| + |b2 x2| + |a1 y1| + |a2 y2| + 2^(F-1) <= 2^63 - 1 is asserted per sample',
  blockSum: 'sat_W(sum of saturated section outputs), summed in 64 bits',
  resetState: 'x[n-1] = x[n-2] = y[n-1] = y[n-2] = 0',
  coefficientRounding: 'round half away from zero of c * 2^F, F largest integer <= 62 with every code within +-(2^(W-1) - 1)',
} as const;

/** Error of the bit-exact model: `code` tells which rule a call broke. */
export class FixedArithmeticError extends Error {
  /** Stable machine-readable reason. */
  readonly code: 'invalid-coefficients' | 'invalid-input' | 'accumulator-overflow';
  /**
   * @param code - machine-readable reason.
   * @param message - human-readable sentence naming the offending value.
   */
  constructor(code: FixedArithmeticError['code'], message: string) {
    super(message);
    this.name = 'FixedArithmeticError';
    this.code = code;
  }
}

/** The 64-bit accumulator bound of {@link FIXED_ARITHMETIC} would be exceeded (some summation order could overflow int64). */
export class AccumulatorOverflowError extends FixedArithmeticError {
  /** Sample index at which the bound was exceeded. */
  readonly sampleIndex: number;
  /**
   * @param sampleIndex - index of the offending sample.
   * @param message - description with the magnitude sum.
   */
  constructor(sampleIndex: number, message: string) {
    super('accumulator-overflow', message);
    this.name = 'AccumulatorOverflowError';
    this.sampleIndex = sampleIndex;
  }
}

/**
 * Largest signal magnitude of a W-bit word under the symmetric saturation of {@link FIXED_ARITHMETIC}.
 *
 * @param wordBits - W (2 to 53).
 * @returns 2^(W-1) - 1.
 * @example
 * signalMax(16); // => 32767
 */
export function signalMax(wordBits: number): number {
  return 2 ** (wordBits - 1) - 1;
}

/**
 * Saturates an integer to the symmetric W-bit range [-(2^(W-1) - 1), 2^(W-1) - 1].
 *
 * @param value - integer (number or bigint).
 * @param wordBits - W.
 * @returns the clamped value as a number.
 * @example
 * saturateToWord(40000, 16); // => 32767
 * saturateToWord(-32768, 16); // => -32767
 */
export function saturateToWord(value: number | bigint, wordBits: number): number {
  const max = signalMax(wordBits);
  if (typeof value === 'bigint') {
    const bigMax = BigInt(max);
    if (value > bigMax) return max;
    if (value < -bigMax) return -max;
    return Number(value);
  }
  if (value > max) return max;
  if (value < -max) return -max;
  return value;
}

/** Delay-line state of one section: the last two inputs and the last two (saturated) outputs. */
export interface FixedSectionState {
  /** The section this state belongs to (validated). */
  readonly fixed: FixedCoefficients;
  /** x[n-1], x[n-2], y[n-1], y[n-2] as W-bit integers. */
  x1: number;
  x2: number;
  y1: number;
  y2: number;
  /** Samples processed since creation or the last reset (used in error messages). */
  sampleIndex: number;
  /** Precomputed 2^(W-1) - 1, 2^(F-1) (or 0) and 2^F of `fixed`. */
  readonly signalMax: number;
  readonly roundingConstant: number;
  readonly divisor: number;
}

const INT64_MAX = (1n << 63n) - 1n;
const TWO_POW_16 = 65536;
const TWO_POW_53 = 2 ** 53;
/** 2^63 (1 - 2^-49): a magnitude sum computed in binary64 (relative error below 2^-50) at or below this is surely <= 2^63 - 1. */
const SURELY_WITHIN_INT64 = 2 ** 63 - 2 ** 14;

/**
 * floor((acc + rc) / 2^F) for acc = b0 x + b1 x1 + b2 x2 - a1 y1 - a2 y2, exactly, in binary64.
 *
 * @param fixed - validated coefficients (W <= 32).
 * @param input - x[n].
 * @param state - the delays.
 * @param rc - rounding constant.
 * @returns the shifted accumulator before saturation (exact when it is within +-2^53, otherwise beyond the word with the right sign).
 */
function splitShift(fixed: FixedCoefficients, input: number, state: FixedSectionState, rc: number): number {
  const b = fixed.b;
  const a = fixed.a;
  let hi = 0;
  let lo = rc;
  let vh = Math.floor(input / TWO_POW_16);
  hi += b[0] * vh;
  lo += b[0] * (input - vh * TWO_POW_16);
  vh = Math.floor(state.x1 / TWO_POW_16);
  hi += b[1] * vh;
  lo += b[1] * (state.x1 - vh * TWO_POW_16);
  vh = Math.floor(state.x2 / TWO_POW_16);
  hi += b[2] * vh;
  lo += b[2] * (state.x2 - vh * TWO_POW_16);
  vh = Math.floor(state.y1 / TWO_POW_16);
  hi -= a[1] * vh;
  lo -= a[1] * (state.y1 - vh * TWO_POW_16);
  vh = Math.floor(state.y2 / TWO_POW_16);
  hi -= a[2] * vh;
  lo -= a[2] * (state.y2 - vh * TWO_POW_16);
  const carry = Math.floor(lo / TWO_POW_16);
  const rest = lo - carry * TWO_POW_16; // [0, 2^16)
  const high = hi + carry; // acc + rc = high * 2^16 + rest
  const f = fixed.fracBits;
  if (f >= 16) return Math.floor(high / 2 ** (f - 16));
  return high * 2 ** (16 - f) + Math.floor(rest / 2 ** f);
}

/**
 * Checks that a quantized section can run in the reference arithmetic.
 *
 * @param fixed - quantized coefficients.
 * @throws FixedArithmeticError when W is not an integer in [2, 32], F is not an integer in
 *   [0, W - 2], aq[0] is not 2^F, or a coefficient is not an integer within +-(2^(W-1) - 1).
 * @returns nothing.
 * @example
 * validateFixedCoefficients({ wordBits: 16, fracBits: 14, b: [0, 0, 0], a: [16384, -32764, 16384], qFormat: 'Q2.14' });
 */
export function validateFixedCoefficients(fixed: FixedCoefficients): void {
  const { wordBits, fracBits } = fixed;
  if (!Number.isInteger(wordBits) || wordBits < 2 || wordBits > 32) {
    throw new FixedArithmeticError('invalid-coefficients', `wordBits must be an integer in [2, 32], got ${wordBits}`);
  }
  if (!Number.isInteger(fracBits) || fracBits < 0 || fracBits > wordBits - 2) {
    throw new FixedArithmeticError('invalid-coefficients', `fracBits must be an integer in [0, ${wordBits - 2}] for ${wordBits}-bit words, got ${fracBits} (coefficients too large for the word)`);
  }
  if (fixed.b.length !== 3 || fixed.a.length !== 3) {
    throw new FixedArithmeticError('invalid-coefficients', `b and a need three entries, got ${fixed.b.length} and ${fixed.a.length}`);
  }
  const limit = signalMax(wordBits);
  [...fixed.b, ...fixed.a].forEach((c, i) => {
    if (!Number.isInteger(c) || Math.abs(c) > limit) {
      const name = i < 3 ? `b[${i}]` : `a[${i - 3}]`;
      throw new FixedArithmeticError('invalid-coefficients', `${name} must be an integer within +-${limit}, got ${c}`);
    }
  });
  if (fixed.a[0] !== 2 ** fracBits) {
    throw new FixedArithmeticError('invalid-coefficients', `a[0] must be 2^F = ${2 ** fracBits}, got ${fixed.a[0]}`);
  }
}

/**
 * Rounding constant added before the shift: 2^(F-1) for F >= 1, 0 for F = 0.
 *
 * @param fracBits - F (>= 0).
 * @returns the constant.
 * @example
 * roundingConstant(14); // => 8192
 */
export function roundingConstant(fracBits: number): number {
  return fracBits >= 1 ? 2 ** (fracBits - 1) : 0;
}

/**
 * Largest input magnitude for which the accumulator bound of {@link FIXED_ARITHMETIC} holds for
 * every sample whatever the outputs (outputs are bounded by the saturated word):
 * `(|bq0| + |bq1| + |bq2|) * X + (|aq1| + |aq2|) * (2^(W-1) - 1) + 2^(F-1) <= 2^63 - 1`, capped at 2^(W-1) - 1.
 *
 * @param fixed - quantized coefficients.
 * @returns X, an integer in [0, 2^(W-1) - 1] (input LSB).
 * @example
 * safeInputMagnitude({ wordBits: 16, fracBits: 14, b: [0, 0, 0], a: [16384, -32764, 16384], qFormat: 'Q2.14' }); // => 32767
 */
export function safeInputMagnitude(fixed: FixedCoefficients): number {
  validateFixedCoefficients(fixed);
  const max = BigInt(signalMax(fixed.wordBits));
  const sumB = fixed.b.reduce((s, c) => s + BigInt(Math.abs(c)), 0n);
  const sumA = BigInt(Math.abs(fixed.a[1])) + BigInt(Math.abs(fixed.a[2]));
  const room = INT64_MAX - sumA * max - BigInt(roundingConstant(fixed.fracBits));
  if (room < 0n) return 0;
  if (sumB === 0n) return Number(max);
  const x = room / sumB;
  return Number(x < max ? x : max);
}

/**
 * Creates the reset state of one section for {@link stepFixedSection} (all delays zero).
 *
 * @param fixed - quantized coefficients (validated here).
 * @returns a fresh state bound to `fixed`.
 * @example
 * const state = createFixedSectionState(fixed); // state.x1 === 0
 */
export function createFixedSectionState(fixed: FixedCoefficients): FixedSectionState {
  validateFixedCoefficients(fixed);
  return { fixed, x1: 0, x2: 0, y1: 0, y2: 0, sampleIndex: 0, signalMax: signalMax(fixed.wordBits), roundingConstant: roundingConstant(fixed.fracBits), divisor: 2 ** fixed.fracBits };
}

/**
 * Resets a section state to zero delays (what the C reset routine does).
 *
 * @param state - the state to clear (mutated).
 * @returns nothing.
 * @example
 * resetFixedSectionState(state); // state.y1 === 0
 */
export function resetFixedSectionState(state: FixedSectionState): void {
  state.x1 = 0;
  state.x2 = 0;
  state.y1 = 0;
  state.y2 = 0;
  state.sampleIndex = 0;
}

/**
 * One sample of the bit-exact Direct Form I section (rules in {@link FIXED_ARITHMETIC}).
 *
 * With a `limit` below the word's maximum the output, and therefore the stored output state, is
 * clamped to +-limit instead of +-(2^(W-1) - 1): the section state stays bounded while a block
 * output is saturated (the PR limit of limits.ts).
 *
 * @param state - section state (mutated: delays shift by one sample).
 * @param input - x[n], an integer within +-(2^(W-1) - 1) (input LSB).
 * @param limit - output clamp in output LSB, an integer in [0, 2^(W-1) - 1] (default the word's maximum).
 * @returns y[n], the saturated W-bit output (output LSB).
 * @throws FixedArithmeticError for a non-integer or out-of-range input or limit,
 *   AccumulatorOverflowError when the accumulator bound fails.
 * @example
 * const s = createFixedSectionState({ wordBits: 16, fracBits: 14, b: [16384, 0, 0], a: [16384, 0, 0], qFormat: 'Q2.14' });
 * stepFixedSection(s, 1234); // => 1234 (unity gain)
 */
export function stepFixedSection(state: FixedSectionState, input: number, limit: number = state.signalMax): number {
  const fixed = state.fixed;
  const word = state.signalMax;
  if (!Number.isInteger(input) || Math.abs(input) > word) {
    throw new FixedArithmeticError('invalid-input', `input sample ${state.sampleIndex} must be an integer within +-${word}, got ${input}`);
  }
  if (!Number.isInteger(limit) || limit < 0 || limit > word) {
    throw new FixedArithmeticError('invalid-input', `limit must be an integer in [0, ${word}], got ${limit}`);
  }
  const max = limit;
  const b0 = fixed.b[0];
  const b1 = fixed.b[1];
  const b2 = fixed.b[2];
  const a1 = fixed.a[1];
  const a2 = fixed.a[2];
  const f = fixed.fracBits;
  const rc = state.roundingConstant;
  const magnitude = Math.abs(b0 * input) + Math.abs(b1 * state.x1) + Math.abs(b2 * state.x2) + Math.abs(a1 * state.y1) + Math.abs(a2 * state.y2) + rc;
  let y: number;
  if (magnitude < TWO_POW_53) {
    // Every product and partial sum is an exact integer in binary64; division by 2^F is exact and
    // Math.floor is the arithmetic shift.
    const acc = b0 * input + b1 * state.x1 + b2 * state.x2 - a1 * state.y1 - a2 * state.y2 + rc;
    const shifted = Math.floor(acc / state.divisor);
    y = shifted > max ? max : shifted < -max ? -max : shifted;
  } else if (magnitude <= SURELY_WITHIN_INT64) {
    // Exact 64-bit evaluation with two binary64 halves (W <= 32, so |c|, |v| < 2^31): each signal
    // v = vh * 2^16 + vl with vl in [0, 2^16), so acc = hi * 2^16 + lo with |hi| < 2^49, |lo| < 2^50,
    // both exact. The rounded magnitude sum proves the accumulator bound here; only the sliver
    // next to 2^63 (and beyond) goes to the exact BigInt check below.
    const shifted = splitShift(fixed, input, state, rc);
    y = shifted > max ? max : shifted < -max ? -max : shifted;
  } else {
    const terms = [BigInt(b0) * BigInt(input), BigInt(b1) * BigInt(state.x1), BigInt(b2) * BigInt(state.x2), -BigInt(a1) * BigInt(state.y1), -BigInt(a2) * BigInt(state.y2)];
    const bound = terms.reduce((s, t) => s + (t < 0n ? -t : t), 0n) + BigInt(rc);
    if (bound > INT64_MAX) {
      throw new AccumulatorOverflowError(state.sampleIndex, `accumulator bound exceeded at sample ${state.sampleIndex}: sum of |products| + 2^(F-1) = ${bound} > 2^63 - 1`);
    }
    const acc = terms.reduce((s, t) => s + t, 0n) + BigInt(rc);
    const shifted = acc >> BigInt(f);
    y = shifted > BigInt(max) ? max : shifted < -BigInt(max) ? -max : Number(shifted);
  }
  state.x2 = state.x1;
  state.x1 = input;
  state.y2 = state.y1;
  state.y1 = y;
  state.sampleIndex += 1;
  return y;
}

/**
 * Bit-exact Direct Form I run of one section from the reset state (CONTRACT section 3; rules in
 * {@link FIXED_ARITHMETIC}).
 *
 * @param fixed - quantized coefficients.
 * @param input - W-bit integer input samples within +-(2^(W-1) - 1) (input LSB).
 * @returns the W-bit integer outputs, one per input (output LSB).
 * @throws FixedArithmeticError / AccumulatorOverflowError as {@link stepFixedSection}.
 * @example
 * runFixedSection({ wordBits: 16, fracBits: 14, b: [8192, 8192, 0], a: [16384, 0, 0], qFormat: 'Q2.14' }, [100, 100, 3]);
 * // => [50, 100, 52]
 */
export function runFixedSection(fixed: FixedCoefficients, input: readonly number[]): number[] {
  const state = createFixedSectionState(fixed);
  return input.map((x) => stepFixedSection(state, x));
}
