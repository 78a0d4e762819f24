// Stateless analysis of a design file.
import { analyzeDesign, type AnalysisResult } from '../../shared/control';
import { AppError } from '../errors';
import { requireValidDesign } from '../designs/designFile';

/** Plot sizes for `?plots=1` (common practice, no source: enough points for smooth Bode and step plots). */
export const PLOT_OPTIONS = { sweepPoints: 400, responseSamples: 400 } as const;

/**
 * Validates and analyses a design.
 * @param candidate - the design sent.
 * @param plots - whether to include sweep and step data.
 * @returns the analysis.
 */
export async function analyze(candidate: unknown, plots: boolean): Promise<AnalysisResult> {
  const design = await requireValidDesign(candidate);
  try {
    return analyzeDesign(design, plots ? PLOT_OPTIONS : { sweepPoints: 0, responseSamples: 0 });
  } catch (err) {
    throw new AppError('analysis-failed', `the design could not be analysed: ${(err as Error).message}`, 422);
  }
}
