import type { AnalysisResult, BlockId } from './types';

// PLACEHOLDER SIGNATURES — to be implemented by the fixed-point work (Core-B). Keep the names.

/** One golden test vector: a documented excitation of one block and the bit-exact expected output. */
export interface GoldenVector {
  blockId: BlockId;
  /** `step`, `chirp` or `noise`. */
  name: string;
  /** How the excitation was made (amplitude in LSB, frequencies in Hz, seed). */
  description: string;
  wordBits: number;
  input: number[];
  expected: number[];
}

/** Options of the golden-vector generator. */
export interface GoldenVectorOptions {
  /** Samples per vector. */
  samples: number;
  /** Seed of the noise excitation. */
  seed: number;
}

/**
 * Golden vectors for every block of an analysis (placeholder).
 * @param analysis - the analysis result (sections with `fixed`).
 * @param gridFrequencyHz - grid frequency for the chirp, Hz.
 * @param options - samples and seed.
 * @returns vectors, sorted by block then name.
 */
export function goldenVectors(analysis: AnalysisResult, gridFrequencyHz: number, options: GoldenVectorOptions): GoldenVector[] {
  void analysis; void gridFrequencyHz; void options;
  throw new Error('goldenVectors: not implemented');
}
