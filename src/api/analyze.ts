// Server-side analysis (CONTRACT section 6: POST /api/analyze); the authority the live preview matches.
import type { AnalysisResult, DesignInput } from '../../shared/control';
import { apiRequest } from './client';

/**
 * Runs the analysis on the server.
 * @param design - the design file content.
 * @returns the `varsmith-analysis/1` result.
 */
export function analyzeOnServer(design: DesignInput): Promise<AnalysisResult> {
  return apiRequest<AnalysisResult>('POST', '/api/analyze', { design });
}
