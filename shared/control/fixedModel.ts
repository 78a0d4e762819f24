import type { FixedCoefficients } from './types';

// PLACEHOLDER SIGNATURES — to be implemented by the fixed-point work (Core-B). Keep the names.

/**
 * Bit-exact Direct Form I run of one section (CONTRACT section 3) (placeholder).
 * @param fixed - quantized coefficients.
 * @param input - W-bit integer input samples.
 * @returns W-bit integer outputs.
 */
export function runFixedSection(fixed: FixedCoefficients, input: readonly number[]): number[] {
  void fixed; void input;
  throw new Error('runFixedSection: not implemented');
}

/**
 * Bit-exact run of a block of parallel sections: output = sat_W(sum of section outputs) (placeholder).
 * @param sections - quantized sections of the block.
 * @param input - W-bit integer input samples.
 * @param wordBits - W.
 * @returns W-bit integer outputs.
 */
export function runFixedBlock(sections: readonly FixedCoefficients[], input: readonly number[], wordBits: number): number[] {
  void sections; void input; void wordBits;
  throw new Error('runFixedBlock: not implemented');
}
