import type { BlockResult, Check, FixedCoefficients, FixedSectionAnalysis, SectionKind } from './types';

// PLACEHOLDER SIGNATURES — to be implemented by the fixed-point work (Core-B). Keep the names.

/** What fixed-point analysis needs to know about a section. */
export interface SectionForFixedAnalysis {
  role: string;
  kind: SectionKind;
  b: readonly number[];
  a: readonly number[];
  prewarpHz: number | null;
}

/**
 * Fixed-point properties of one quantized section (placeholder).
 * @param section - the double-precision section.
 * @param fixed - its quantized coefficients.
 * @param samplePeriodS - Ts in seconds.
 * @returns the analysis.
 */
export function analyzeFixedSection(section: SectionForFixedAnalysis, fixed: FixedCoefficients, samplePeriodS: number): FixedSectionAnalysis {
  void section; void fixed; void samplePeriodS;
  throw new Error('analyzeFixedSection: not implemented');
}

/** Context of the fixed-point checks. */
export interface FixedPointCheckContext {
  samplePeriodS: number;
  wordBits: number;
  gridFrequencyHz: number;
}

/**
 * Fixed-point checks over all blocks (placeholder).
 * @param blocks - blocks whose sections carry `fixed`, `resonanceHz` and `fixedAnalysis`.
 * @param context - sampling and word length.
 * @returns the checks.
 */
export function fixedPointChecks(blocks: readonly BlockResult[], context: FixedPointCheckContext): Check[] {
  void blocks; void context;
  throw new Error('fixedPointChecks: not implemented');
}
