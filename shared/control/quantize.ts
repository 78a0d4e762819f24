import type { FixedCoefficients } from './types';

/**
 * Rounding mode of a quantizer, applied to the exact scaled value `value * 2^F`:
 * `nearest-even` (ties to the even integer), `nearest-away` (ties away from zero, the coefficient
 * rule of CONTRACT section 3), `floor` (towards minus infinity, what an arithmetic right shift
 * does), `zero` (truncation towards zero).
 */
export type Rounding = 'nearest-even' | 'nearest-away' | 'floor' | 'zero';

/**
 * Overflow behaviour of a quantizer: `saturate` clamps the code to the format's range, `wrap`
 * keeps the low `wordBits` bits (two's complement for signed formats), like an integer cast in C.
 */
export type Overflow = 'saturate' | 'wrap';

/**
 * A fixed-point format: a `wordBits`-bit word whose code `k` represents `k * 2^-fracBits`.
 * Signed formats are two's complement, codes in [-2^(W-1), 2^(W-1) - 1]; unsigned codes in
 * [0, 2^W - 1]. `fracBits` may be negative (a coarse step of 2^-F) or exceed `wordBits`
 * (a word holding only small values). Codes are JavaScript numbers, so `wordBits` is at most 53.
 */
export interface QFormat {
  /** Word length W in bits, integer in [1, 53] (2 or more when signed). */
  wordBits: number;
  /** Fraction bits F, integer in [-1074, 1074]; the step (LSB) is 2^-F. */
  fracBits: number;
  /** Two's complement when true, unsigned when false. */
  signed: boolean;
}

/** Result of quantizing one value: the integer code, the value the code represents, and whether it overflowed. */
export interface QuantizedValue {
  /** Integer code in the format's range. */
  code: number;
  /** Represented value `code * 2^-F` (same unit as the input). */
  value: number;
  /** True when the rounded code did not fit the range and was saturated or wrapped. */
  overflowed: boolean;
}

/** Largest integer (exclusive bound) below which every double can carry a fraction: 2^52. */
const TWO_POW_52 = 4503599627370496;

/**
 * Rounds a finite double to an integer, exactly, in the given mode.
 *
 * Method: works on the magnitude m = |x|. For m >= 2^52 every double is already an integer; below
 * it `m - floor(m)` is exact (Sterbenz: floor(m) <= m <= 2 floor(m) for m >= 1, and m itself for
 * m < 1), so the tie test `frac === 0.5` is exact and no `x + 0.5` (which can round in binary64)
 * is ever formed. Working on x directly would not be exact: -0.49999999999999994 - (-1) rounds to 0.5.
 *
 * Special cases: a zero result is +0, never -0.
 *
 * @param x - finite value (dimensionless).
 * @param rounding - rounding mode.
 * @returns the rounded integer as a double (exact).
 * @example
 * roundToInteger(-2.5, 'nearest-away'); // => -3
 * roundToInteger(-2.5, 'nearest-even'); // => -2
 * roundToInteger(0.49999999999999994, 'nearest-away'); // => 0 (the classic Math.round(x + 0.5) trap)
 */
export function roundToInteger(x: number, rounding: Rounding): number {
  if (!Number.isFinite(x)) throw new RangeError(`roundToInteger: value must be finite, got ${x}`);
  const negative = x < 0;
  const m = Math.abs(x);
  if (m >= TWO_POW_52) return x;
  const low = Math.floor(m);
  const frac = m - low;
  let r: number;
  switch (rounding) {
    case 'floor':
      r = negative && frac !== 0 ? low + 1 : low;
      break;
    case 'zero':
      r = low;
      break;
    case 'nearest-away':
      r = frac >= 0.5 ? low + 1 : low;
      break;
    case 'nearest-even':
      r = frac > 0.5 || (frac === 0.5 && low % 2 === 1) ? low + 1 : low;
      break;
  }
  if (r === 0) return 0;
  return negative ? -r : r;
}

/**
 * Range of the integer codes of a format.
 *
 * @param format - the format (see {@link QFormat}).
 * @returns `{ min, max }`: [-2^(W-1), 2^(W-1) - 1] signed, [0, 2^W - 1] unsigned.
 * @example
 * codeRange({ wordBits: 16, fracBits: 15, signed: true }); // => { min: -32768, max: 32767 }
 */
export function codeRange(format: QFormat): { min: number; max: number } {
  validateFormat(format);
  if (format.signed) return { min: -(2 ** (format.wordBits - 1)), max: 2 ** (format.wordBits - 1) - 1 };
  return { min: 0, max: 2 ** format.wordBits - 1 };
}

/**
 * Quantizes one real value to a fixed-point code (STYLE habit 10: rounding and overflow are explicit).
 *
 * Method: the scaled value `value * 2^F` is exact in binary64 (power-of-two scaling, away from the
 * subnormal and overflow ranges), it is rounded exactly by {@link roundToInteger}, then the code is
 * saturated to the range or wrapped modulo 2^W (two's complement for signed formats).
 *
 * Special cases: NaN or an infinite value throws a RangeError (never a silent code); `-0` gives
 * code 0; with `wrap` the reported `value` is the wrapped code's value.
 *
 * @param value - real value, in the unit the format scales (e.g. per unit, or dimensionless coefficient).
 * @param format - target format.
 * @param rounding - rounding mode (required).
 * @param overflow - overflow mode (required).
 * @returns `{ code, value, overflowed }`, `value = code * 2^-F`.
 * @example
 * const q15 = { wordBits: 16, fracBits: 15, signed: true };
 * quantizeValue(-1, q15, 'nearest-away', 'saturate'); // => { code: -32768, value: -1, overflowed: false }
 * quantizeValue(1, q15, 'nearest-away', 'saturate');  // => { code: 32767, value: 0.999969482421875, overflowed: true }
 * quantizeValue(1, q15, 'nearest-away', 'wrap');      // => { code: -32768, value: -1, overflowed: true }
 */
export function quantizeValue(value: number, format: QFormat, rounding: Rounding, overflow: Overflow): QuantizedValue {
  if (!Number.isFinite(value)) throw new RangeError(`quantizeValue: value must be finite, got ${value}`);
  const { min, max } = codeRange(format);
  const rounded = roundToInteger(scaleByPowerOfTwo(value, format.fracBits), rounding);
  let code = rounded;
  let overflowed = false;
  if (rounded < min || rounded > max) {
    overflowed = true;
    code = overflow === 'saturate' ? (rounded < min ? min : max) : wrapToWord(rounded, format);
  }
  code = code === 0 ? 0 : code; // normalise -0
  return { code, value: scaleByPowerOfTwo(code, -format.fracBits), overflowed };
}

/**
 * Largest coefficient integer magnitude of a W-bit coefficient word under the CONTRACT rule:
 * codes are kept within the symmetric range [-(2^(W-1) - 1), 2^(W-1) - 1].
 *
 * @param wordBits - W, integer in [2, 53].
 * @returns 2^(W-1) - 1.
 * @example
 * maxCoefficientCode(16); // => 32767
 */
export function maxCoefficientCode(wordBits: number): number {
  validateWordBits(wordBits);
  return 2 ** (wordBits - 1) - 1;
}

/** Upper limit of the fraction bits of a coefficient (CONTRACT section 3). */
export const MAX_FRAC_BITS = 62;

/**
 * Largest fraction-bit count F (at most 62) for which every `round(c * 2^F)` (half away from zero)
 * lies within [-(2^(W-1) - 1), 2^(W-1) - 1] (CONTRACT section 3).
 *
 * Method: |round(c * 2^F)| is non-decreasing in F, so F is found by stepping down from 62; the
 * scaled values are exact (power-of-two scaling) and rounded exactly. Zero coefficients fit any F.
 *
 * Special cases: all coefficients zero gives 62. F can be negative for coefficients of magnitude
 * 2^(W-1) and above (the LSB is then 2^-F > 1). When a[0] = 1 is among the coefficients (as in
 * {@link quantizeSection}) F is at most W - 2, because 2^(W-1) does not fit the symmetric range.
 * NaN or infinite coefficients throw a RangeError.
 *
 * @param coefficients - dimensionless coefficients quantized with one common F.
 * @param wordBits - W, integer in [2, 53].
 * @returns F (integer, at most 62).
 * @example
 * maxFracBits([1, -1.999753264963321, 1], 16); // => 14 (a1 * 2^15 = -65528 would not fit 32767)
 * maxFracBits([1, -1.999753264963321, 1], 32); // => 30
 */
export function maxFracBits(coefficients: readonly number[], wordBits: number): number {
  const limit = maxCoefficientCode(wordBits);
  let largest = 0;
  for (const c of coefficients) {
    if (!Number.isFinite(c)) throw new RangeError(`maxFracBits: coefficients must be finite, got ${c}`);
    largest = Math.max(largest, Math.abs(c));
  }
  if (largest === 0) return MAX_FRAC_BITS;
  // Start at the F where largest * 2^F is just below 2^(W-1); the answer is that F or one below,
  // but stepping from a safe upper start keeps the rule literal.
  const exponent = Math.floor(Math.log2(largest));
  let f = Math.min(MAX_FRAC_BITS, wordBits - 1 - exponent + 1);
  for (;;) {
    if (fitsWithFracBits(largest, f, limit)) return f;
    f -= 1;
  }
}

/**
 * Quantizes one second-order section per CONTRACT section 3: one common F for all six entries
 * (b0, b1, b2, a0 = 1, a1, a2), F from {@link maxFracBits}, integers `round(c * 2^F)` with
 * round-half-away-from-zero, within [-(2^(W-1) - 1), 2^(W-1) - 1].
 *
 * Because a[0] = 1 is quantized with the same F, F <= W - 2 and the quantized a[0] is exactly 2^F,
 * which is what the `>> F` of the reference arithmetic divides by. A section whose largest
 * coefficient is 2^(W-2) or more gets F <= 0 (see `qFormat`); the bit-exact model refuses F < 0.
 *
 * @param b - numerator in powers of z^-1, 1 to 3 entries (zero-padded to 3), dimensionless.
 * @param a - denominator in powers of z^-1, 1 to 3 entries (zero-padded to 3), a[0] = 1.
 * @param wordBits - coefficient and signal word length W (16 or 32 in designs; any integer in [2, 53]).
 * @returns the quantized coefficients with their Q-format label.
 * @example
 * quantizeSection([2.499897192889162e-05, 0, -2.499897192889162e-05], [1, -1.999753264963321, 1], 16);
 * // => { wordBits: 16, fracBits: 14, b: [0, 0, 0], a: [16384, -32764, 16384], qFormat: 'Q2.14' }
 */
export function quantizeSection(b: readonly number[], a: readonly number[], wordBits: number): FixedCoefficients {
  if (b.length < 1 || b.length > 3 || a.length < 1 || a.length > 3) {
    throw new RangeError(`quantizeSection: b and a need 1 to 3 entries, got ${b.length} and ${a.length}`);
  }
  if (a[0] !== 1) throw new RangeError(`quantizeSection: a[0] must be 1, got ${a[0]}`);
  const bPadded = [0, 1, 2].map((i) => b[i] ?? 0);
  const aPadded = [0, 1, 2].map((i) => a[i] ?? 0);
  const fracBits = maxFracBits([...bPadded, ...aPadded], wordBits);
  const toInteger = (c: number): number => {
    const code = roundToInteger(scaleByPowerOfTwo(c, fracBits), 'nearest-away');
    return code === 0 ? 0 : code;
  };
  return {
    wordBits,
    fracBits,
    b: bPadded.map(toInteger),
    a: aPadded.map(toInteger),
    qFormat: qFormatLabel(wordBits, fracBits),
  };
}

/**
 * Q-format label `Q<I>.<F>` with I = W - F integer bits including the sign bit.
 *
 * I can be below 1 for a word holding only small values (F > W - 1, e.g. `Q-3.35` for W = 32,
 * F = 35: the top bit weighs 2^-4) and F can be negative for a coarse word (`Q18.-2`: LSB = 4).
 * Sections quantized with a[0] = 1 always have I >= 2.
 *
 * @param wordBits - W.
 * @param fracBits - F.
 * @returns the label.
 * @example
 * qFormatLabel(32, 30); // => 'Q2.30'
 * qFormatLabel(16, 14); // => 'Q2.14'
 */
export function qFormatLabel(wordBits: number, fracBits: number): string {
  return `Q${wordBits - fracBits}.${fracBits}`;
}

/**
 * Exact `value * 2^exponent` for finite values (splits the scaling so that 2^exponent itself never
 * overflows or underflows for |exponent| up to 1074).
 *
 * @param value - finite value.
 * @param exponent - integer power of two.
 * @returns the scaled value (exact unless it leaves the normal binary64 range).
 * @example
 * scaleByPowerOfTwo(3, -2); // => 0.75
 */
export function scaleByPowerOfTwo(value: number, exponent: number): number {
  if (!Number.isInteger(exponent)) throw new RangeError(`scaleByPowerOfTwo: exponent must be an integer, got ${exponent}`);
  let result = value;
  let remaining = exponent;
  while (remaining > 1000) {
    result *= 2 ** 1000;
    remaining -= 1000;
  }
  while (remaining < -1000) {
    result *= 2 ** -1000;
    remaining += 1000;
  }
  return result * 2 ** remaining;
}

function fitsWithFracBits(magnitude: number, fracBits: number, limit: number): boolean {
  return roundToInteger(scaleByPowerOfTwo(magnitude, fracBits), 'nearest-away') <= limit;
}

function wrapToWord(code: number, format: QFormat): number {
  const modulus = 2 ** format.wordBits;
  // code is an integer double; exact remainder for |code| < 2^1024 because % is exact in IEEE.
  let wrapped = code % modulus;
  if (wrapped < 0) wrapped += modulus;
  if (format.signed && wrapped >= modulus / 2) wrapped -= modulus;
  return wrapped;
}

function validateWordBits(wordBits: number): void {
  if (!Number.isInteger(wordBits) || wordBits < 2 || wordBits > 53) {
    throw new RangeError(`wordBits must be an integer in [2, 53], got ${wordBits}`);
  }
}

function validateFormat(format: QFormat): void {
  const minBits = format.signed ? 2 : 1;
  if (!Number.isInteger(format.wordBits) || format.wordBits < minBits || format.wordBits > 53) {
    throw new RangeError(`format.wordBits must be an integer in [${minBits}, 53], got ${format.wordBits}`);
  }
  if (!Number.isInteger(format.fracBits) || Math.abs(format.fracBits) > 1074) {
    throw new RangeError(`format.fracBits must be an integer in [-1074, 1074], got ${format.fracBits}`);
  }
}
