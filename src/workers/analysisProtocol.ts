// Messages between the workspace and the analysis worker.
import type { AnalysisOptions, AnalysisResult, DesignInput } from '../../shared/control';

/** Work for the analysis worker. */
export interface AnalysisRequest {
  id: number;
  design: DesignInput;
  options: AnalysisOptions;
}

/** The worker's answer to one request. */
export type AnalysisReply =
  | { id: number; ok: true; result: AnalysisResult; elapsedMs: number }
  | { id: number; ok: false; message: string; elapsedMs: number };
