// The views of an analysis, in the order the workspace and the revision page show them. A new
// view (an operating-envelope map, a time-domain run) is one entry here and one panel in
// AnalysisPanels.vue.
import type { AppTab } from '../components/AppTabBar.vue';

/** Names of the analysis views. */
export type AnalysisTabName = 'findings' | 'shape' | 'steps' | 'poles' | 'resonances' | 'fixed' | 'run';

/** The analysis views with their plain names. */
export const ANALYSIS_TABS: readonly (AppTab & { name: AnalysisTabName })[] = [
  { name: 'findings', label: 'Findings', icon: 'rule' },
  { name: 'shape', label: 'Loop shapes', icon: 'show_chart' },
  { name: 'steps', label: 'Step responses', icon: 'stairs' },
  { name: 'poles', label: 'Pole map', icon: 'blur_circular' },
  { name: 'resonances', label: 'Resonance frequencies', icon: 'graphic_eq' },
  { name: 'fixed', label: 'Fixed point', icon: 'memory' },
  { name: 'run', label: 'Time-domain run', icon: 'timeline' },
];
