/**
 * The `varsmith-simulation/1` result (CONTRACT section 10) and the options of a run. Fields may be
 * added, never renamed or removed. Values that can be absent are `number | null` with a reason.
 */
import type { CoefficientSet } from './referenceController';
import type { BridgeModel } from './engine';
import type { SourceHarmonic } from './grid';
import type { HarmonicLimitResult, HarmonicTable } from './harmonicLimits';
import type { Quantization } from './sensing';

/** The scenarios of CONTRACT section 10. */
export type ScenarioId = 'steady' | 'reactive-step' | 'frequency-step' | 'voltage-sag';

/** Every scenario id, in CONTRACT order. */
export const SCENARIO_IDS: readonly ScenarioId[] = ['steady', 'reactive-step', 'frequency-step', 'voltage-sag'];

/** Every bridge model. */
export const BRIDGE_MODELS: readonly BridgeModel[] = ['averaged', 'switched'];

/** Options of a scenario run (explicit: nothing here has a hidden default; see `defaultSimulationOptions`). */
export interface SimulationOptions {
  scenario: ScenarioId;
  model: BridgeModel;
  /** Recorded run length, s; null = the scenario's default. */
  durationS: number | null;
  /** Grid short-circuit ratio at the PCC; null = stiff grid; undefined = the design's `envelope.shortCircuitRatioMin` (stiff when absent). */
  shortCircuitRatio?: number | null;
  /** Harmonic-limit table the grid current is compared with. */
  harmonicTable: HarmonicTable;
  /** Background harmonics of the grid source. */
  backgroundHarmonics: SourceHarmonic[];
  /** Power of an added diode-rectifier load, W; null = none. */
  rectifierPowerW: number | null;
  /** Coefficients the double-precision reference controller runs. */
  coefficients: CoefficientSet;
  /** Rounding of ADC codes and compare counts. */
  quantization: Quantization;
  /** Points per trace at most. */
  tracePoints: number;
}

/** Metrics of CONTRACT section 10 (over the last 5 grid cycles), with additions. */
export interface SimulationMetrics {
  /** P / (V_rms I_rms) at the PCC, grid side (true power factor); null without grid current. */
  gridPowerFactor: number | null;
  /** Mean power from the grid into the PCC, W. */
  gridActivePowerW: number;
  /** Fundamental reactive power from the grid into the PCC, var (positive: the grid supplies inductive vars). */
  gridReactivePowerVar: number;
  /** Fundamental reactive power the load draws, var (positive inductive). */
  loadReactivePowerVar: number;
  /** Grid-current THD, IEEE 519 definition (orders 2 to 50), percent; null without a fundamental. */
  gridCurrentThdPercent: number | null;
  /** Grid-current harmonic amplitudes as percent of the fundamental, keyed by order "2".."50". */
  gridCurrentHarmonicsPercent: Record<string, number>;
  dcLinkMeanV: number;
  dcLinkRipplePeakToPeakV: number;
  /** Largest |inverter current| in the window (switching ripple included), A. */
  peakInverterCurrentA: number;
  /** Mean PLL frequency over the window's samples, Hz; null when the controller does not log it. */
  pllFrequencyHz: number | null;
  /** Time from the scenario's event (from 0 in `steady`) until the monitored one-cycle averages stay within their bands; null when they do not within the run. */
  settlingTimeS: number | null;
  /** Mean power the load draws, W. */
  loadActivePowerW: number;
  /** Fundamental reactive power the unit delivers into the PCC, var. */
  unitReactivePowerVar: number;
  /** Fundamental grid current, A rms. */
  gridCurrentFundamentalRmsA: number;
  /** PCC voltage, V rms (switching content included). */
  pccVoltageRmsV: number;
  /** Fundamental of the PCC voltage, V rms. */
  pccVoltageFundamentalRmsV: number;
  /** The design's current reference limit, peak A. */
  currentLimitA: number;
  /** Largest |inverter current| over the whole recorded run, A. */
  peakInverterCurrentRunA: number;
  /**
   * Amplitude of the fundamental of the tracking error i_ref - i_inverter over the window, percent of
   * the rated peak current: how well the current loop tracks at the grid frequency (null when the
   * controller does not log its reference).
   */
  fundamentalTrackingErrorPercent: number | null;
  /** How the settling time was measured, and why it is null when it is. */
  settling: { fromS: number; bands: { signal: string; band: number; unit: string }[]; note: string | null };
  /** Grid power = load power + converter losses + change of stored energy, over the window. */
  energyBalance: { gridActivePowerW: number; loadActivePowerW: number; converterLossW: number; storedEnergyRateW: number; residualW: number };
}

/** Traces for plots (recorded clock, t = 0 after the warm-up); controller signals null when not logged. */
export interface SimulationTraces {
  timeS: number[];
  gridVoltageV: number[];
  gridCurrentA: number[];
  inverterCurrentA: number[];
  loadCurrentA: number[];
  dcLinkVoltageV: number[];
  pllFrequencyHz: number[] | null;
  /** PLL angle minus the grid source's angle, deg (with a grid impedance it includes the angle across it). */
  pllAngleErrorDeg: number[] | null;
  /** The controller's estimate of the load current along its cos template, A. */
  reactiveCurrentEstimateA: number[] | null;
  /** The same quantity from the true load current and the source angle, one-cycle average, A. */
  reactiveCurrentTrueA: number[];
  currentReferenceA: number[] | null;
  modulationIndex: number[] | null;
}

/** A `varsmith-simulation/1` result (CONTRACT section 10). */
export interface SimulationResult {
  format: 'varsmith-simulation/1';
  scenario: ScenarioId;
  model: BridgeModel;
  durationS: number;
  sampleTimeS: number;
  /** The load at the end of the run, at nominal voltage (phasor values; the rectifier's nominal power added as active power). */
  load: { activePowerW: number; reactivePowerVar: number; description: string };
  metrics: SimulationMetrics;
  traces: SimulationTraces;
  /** Design name. */
  design: string;
  /** What ran in the loop. */
  controller: { kind: string; coefficients: string | null; quantization: Quantization };
  grid: { shortCircuitRatio: number | null; inductanceH: number; initialFrequencyHz: number; finalFrequencyHz: number; initialVoltageRmsV: number; finalVoltageRmsV: number; backgroundHarmonics: SourceHarmonic[] };
  /** Time of the scenario's event on the recorded clock, s (null for `steady`). */
  eventTimeS: number | null;
  /** Simulated time before the recorded run (averaged model), s. */
  warmupS: number;
  /** Metrics window on the recorded clock, s. */
  window: { startS: number; endS: number; cycles: number };
  integrator: { method: 'trapezoidal'; substepsPerSample: number; stepBoundRad: number; capReached: boolean };
  harmonicLimits: HarmonicLimitResult;
  /** Assumptions and warnings, one sentence each. */
  notes: string[];
}
