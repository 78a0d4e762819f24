import type { FixedCoefficients } from './types';

// PLACEHOLDER SIGNATURES — to be implemented by the fixed-point work (Core-B). Keep the names.

/** Rounding mode of a quantizer. */
export type Rounding = 'nearest-even' | 'nearest-away' | 'floor' | 'zero';
/** Overflow behaviour of a quantizer. */
export type Overflow = 'saturate' | 'wrap';
/** A fixed-point format: W-bit word with F fraction bits. */
export interface QFormat {
  wordBits: number;
  fracBits: number;
  signed: boolean;
}

/**
 * Quantizes one value (placeholder).
 * @param value - real value.
 * @param format - target format.
 * @param rounding - rounding mode.
 * @param overflow - overflow mode.
 * @returns code, represented value and overflow flag.
 */
export function quantizeValue(value: number, format: QFormat, rounding: Rounding, overflow: Overflow): { code: number; value: number; overflowed: boolean } {
  void value; void format; void rounding; void overflow;
  throw new Error('quantizeValue: not implemented');
}

/**
 * Largest F (<= 62) for which every round(c * 2^F) fits in +-(2^(W-1) - 1) (placeholder).
 * @param coefficients - the section's coefficients.
 * @param wordBits - W.
 * @returns F.
 */
export function maxFracBits(coefficients: readonly number[], wordBits: number): number {
  void coefficients; void wordBits;
  throw new Error('maxFracBits: not implemented');
}

/**
 * Quantizes a section per CONTRACT section 3 (placeholder).
 * @param b - numerator, three entries.
 * @param a - denominator, three entries, a[0] = 1.
 * @param wordBits - 16 or 32.
 * @returns the fixed coefficients.
 */
export function quantizeSection(b: readonly number[], a: readonly number[], wordBits: number): FixedCoefficients {
  void b; void a; void wordBits;
  throw new Error('quantizeSection: not implemented');
}
