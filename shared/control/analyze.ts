import type { AnalysisOptions, AnalysisResult, DesignInput } from './types';

// PLACEHOLDER SIGNATURE — to be implemented by the core work (Core-A). Keep the name.

/**
 * Full analysis of a validated design (placeholder).
 * @param design - a validated `varsmith-design/1` design.
 * @param options - sweep and response sizes.
 * @returns the `varsmith-analysis/1` result.
 */
export function analyzeDesign(design: DesignInput, options: AnalysisOptions): AnalysisResult {
  void design; void options;
  throw new Error('analyzeDesign: not implemented');
}
