// Plot data for a frozen revision. Stored revisions keep the numbers only (no sweeps or step
// responses); the page recomputes the plots from the frozen inputs with the same core the server
// used, off the main thread.
import { computed, type ComputedRef, type Ref } from 'vue';
import type { AnalysisResult, DesignInput } from '../../shared/control';
import { useLiveAnalysis } from './useLiveAnalysis';

/** Plot data of one revision. */
export interface RevisionPlots {
  /** The recomputed result with `responses`, null until it arrives. */
  result: ComputedRef<AnalysisResult | null>;
  error: Ref<string | null>;
  running: Ref<boolean>;
}

/**
 * Recomputes a frozen design's plot data.
 * @param design - the revision's design (null until loaded).
 * @returns the result with plot data and its state.
 */
export function useRevisionPlots(design: Ref<DesignInput | null>): RevisionPlots {
  const live = useLiveAnalysis(design);
  return { result: computed(() => live.result.value), error: live.error, running: live.running };
}
