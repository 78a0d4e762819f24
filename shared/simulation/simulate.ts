/**
 * A scenario run of the whole system (CONTRACT section 10): builds the plant of a design, starts it
 * from its idle steady state, warms the closed loop up (averaged bridge) until the slow loops have
 * settled, runs the scenario and computes the metrics over the last 5 grid cycles.
 *
 * Caps (every loop whose length follows from input): the recorded length is at most
 * {@link DURATION_MAX_S}, warm-up plus recorded samples at most {@link SAMPLES_MAX}, substeps per
 * interval at most `SUBSTEPS_MAX`, trace points at most {@link TRACE_POINTS_MAX}.
 */
import type { AnalysisResult, DesignInput } from '../control';
import { perUnitBases, resolveSignals } from '../control';
import type { SampledController } from './controller';
import { runSystem } from './engine';
import { SimulationError } from './errors';
import { gridInductanceForScr, type GridSource } from './grid';
import { HARMONIC_TABLE_MAX_ORDER } from './harmonicLimits';
import { TRAPEZOID_STEP_RAD } from './integrator';
import { rectifierLoadForPower } from './loads';
import { computeMetrics } from './metrics';
import { networkLayout, type PlantConfig } from './network';
import { idleOperatingPoint, type OperatingPoint } from './operatingPoint';
import { createReferenceController } from './referenceController';
import { DEFAULT_DURATION_S, finalLoadPower, METRIC_WINDOW_CYCLES, scenarioPlan } from './scenarios';
import { designSensing, unipolarCompares, type Quantization } from './sensing';
import { BRIDGE_MODELS, SCENARIO_IDS, type ScenarioId, type SimulationOptions, type SimulationResult, type SimulationTraces } from './types';

/** Longest recorded run, s. */
export const DURATION_MAX_S = 10;
/** Shortest recorded run, in nominal grid cycles (the 5-cycle window plus room for an event before it). */
export const DURATION_MIN_CYCLES = 10;
/** Most control samples of one run, warm-up included (about 10 s at 400 kHz sampling is beyond it: shorten the run). */
export const SAMPLES_MAX = 4_000_000;
/** Most points per trace. */
export const TRACE_POINTS_MAX = 20000;
/** Warm-up bounds, s. */
export const WARMUP_MIN_S = 0.2;
/** Longest warm-up, s. */
export const WARMUP_MAX_S = 2;
/** Warm-up: this many times the slowest of the estimator settling time, the PLL settling time and 1 / DC-link crossover. */
export const WARMUP_SETTLING_MULTIPLE = 3;
/**
 * DC-link loss resistance: it dissipates this fraction of the rating at the reference voltage,
 * standing for the converter's switching and conduction losses (common practice, no source).
 */
export const DC_LINK_LOSS_FRACTION = 0.01;
/** Largest rectifier load, multiples of the rating. */
export const RECTIFIER_POWER_MAX_FRACTION = 2;
/** Largest background harmonic, fraction of the fundamental (beyond any public grid; EN 50160 allows 6 % for the 5th, from memory). */
export const BACKGROUND_HARMONIC_MAX_FRACTION = 0.2;

/** Stated with every result: a simulation is no substitute for a bench test. */
export const SIMULATION_SAFETY_NOTE = 'A simulation does not replace a current-limited bench or hardware-in-the-loop test: verify every set there before energizing mains-connected hardware.';

/**
 * Options with every field at its documented default for a scenario.
 *
 * @param scenario - the scenario.
 * @returns averaged model, default duration, SCR from the design, IEEE 519 table, no background harmonics, no rectifier, double coefficients, firmware rounding, 2000 trace points.
 * @example
 * defaultSimulationOptions('steady').model; // => 'averaged'
 */
export function defaultSimulationOptions(scenario: ScenarioId): SimulationOptions {
  return {
    scenario,
    model: 'averaged',
    durationS: null,
    harmonicTable: 'ieee-519',
    backgroundHarmonics: [],
    rectifierPowerW: null,
    coefficients: 'double',
    quantization: 'firmware',
    tracePoints: 2000,
  };
}

/**
 * Warm-up length of a design (see {@link WARMUP_SETTLING_MULTIPLE}), within [0.2, 2] s.
 *
 * @param design - the design.
 * @param analysis - its analysis (estimator settling time).
 * @returns the warm-up, s.
 * @example
 * warmupDurationS(sc3, analysis); // => 0.3 (3 / 10 Hz)
 */
export function warmupDurationS(design: DesignInput, analysis: AnalysisResult): number {
  const estimator = typeof analysis.plant.estimatorSettlingTimeS === 'number' ? analysis.plant.estimatorSettlingTimeS : 0;
  const slowest = Math.max(estimator, design.pll.settlingTimeS, 1 / design.voltageLoop.crossoverHz);
  return Math.min(WARMUP_MAX_S, Math.max(WARMUP_MIN_S, WARMUP_SETTLING_MULTIPLE * slowest));
}

function invalid(path: string, rule: string): never {
  throw new SimulationError('invalid-option', `${path} ${rule}`, path);
}

function validate(design: DesignInput, o: SimulationOptions): void {
  if (!SCENARIO_IDS.includes(o.scenario)) invalid('scenario', `must be one of ${SCENARIO_IDS.join(', ')}`);
  if (!BRIDGE_MODELS.includes(o.model)) invalid('model', `must be one of ${BRIDGE_MODELS.join(', ')}`);
  const minS = DURATION_MIN_CYCLES / design.grid.frequencyHz;
  if (o.durationS !== null && !(Number.isFinite(o.durationS) && o.durationS >= minS && o.durationS <= DURATION_MAX_S)) {
    invalid('durationS', `must be a number of seconds in [${minS.toPrecision(4)}, ${DURATION_MAX_S}] (${DURATION_MIN_CYCLES} grid cycles to ${DURATION_MAX_S} s)`);
  }
  const scr = o.shortCircuitRatio;
  if (scr !== undefined && scr !== null && !(Number.isFinite(scr) && scr >= 1 && scr <= 1e4)) invalid('shortCircuitRatio', 'must be null (stiff grid) or a number in [1, 10000]');
  if (!(o.harmonicTable in HARMONIC_TABLE_MAX_ORDER)) invalid('harmonicTable', 'must be "ieee-519" or "iec-61000-3-2-class-a"');
  if (!Array.isArray(o.backgroundHarmonics) || o.backgroundHarmonics.length > 10) invalid('backgroundHarmonics', 'must be a list of at most 10 harmonics');
  o.backgroundHarmonics.forEach((h, i) => {
    if (!(Number.isInteger(h.harmonic) && h.harmonic >= 2 && h.harmonic <= 50)) invalid(`backgroundHarmonics.${i}.harmonic`, 'must be an integer from 2 to 50');
    if (!(Number.isFinite(h.fraction) && h.fraction >= 0 && h.fraction <= BACKGROUND_HARMONIC_MAX_FRACTION)) invalid(`backgroundHarmonics.${i}.fraction`, `must lie in [0, ${BACKGROUND_HARMONIC_MAX_FRACTION}]`);
    if (!(Number.isFinite(h.phaseDeg) && Math.abs(h.phaseDeg) <= 360)) invalid(`backgroundHarmonics.${i}.phaseDeg`, 'must lie in [-360, 360]');
  });
  const pMax = RECTIFIER_POWER_MAX_FRACTION * design.rating.apparentPowerVA;
  if (o.rectifierPowerW !== null && !(Number.isFinite(o.rectifierPowerW) && o.rectifierPowerW > 0 && o.rectifierPowerW <= pMax)) invalid('rectifierPowerW', `must be null or a power in (0, ${pMax}] W`);
  if (o.coefficients !== 'double' && o.coefficients !== 'quantized') invalid('coefficients', 'must be "double" or "quantized"');
  if (o.quantization !== 'firmware' && o.quantization !== 'none') invalid('quantization', 'must be "firmware" or "none"');
  if (!(Number.isInteger(o.tracePoints) && o.tracePoints >= 10 && o.tracePoints <= TRACE_POINTS_MAX)) invalid('tracePoints', `must be an integer from 10 to ${TRACE_POINTS_MAX}`);
}

/**
 * The plant of a design: its filter and DC link (with a loss resistance of {@link DC_LINK_LOSS_FRACTION}),
 * the grid inductance of a short-circuit ratio, and loads.
 *
 * @param design - the design.
 * @param shortCircuitRatio - SCR, null = stiff.
 * @param loads - load branches.
 * @param rectifierPowerW - rectifier load power, W, or null.
 * @returns the plant.
 * @example
 * designPlant(sc3, 5, [], null).grid.inductanceH; // => 2.315e-3
 */
export function designPlant(design: DesignInput, shortCircuitRatio: number | null, loads: PlantConfig['loads'], rectifierPowerW: number | null): PlantConfig {
  const vRef = design.dcLink.voltageRefV;
  return {
    grid: { inductanceH: gridInductanceForScr(design, shortCircuitRatio), resistanceOhm: 0 },
    filter: design.filter,
    dcLink: { capacitanceF: design.dcLink.capacitanceF, lossResistanceOhm: (vRef * vRef) / (DC_LINK_LOSS_FRACTION * design.rating.apparentPowerVA) },
    loads,
    rectifier: rectifierPowerW === null ? null : rectifierLoadForPower(design.grid.voltageRmsV, design.grid.frequencyHz, rectifierPowerW),
  };
}

function column(values: Float64Array, count: number): number[] {
  return Array.from(values.subarray(0, count));
}

function optionalColumn(values: Float64Array, count: number): number[] | null {
  const out = column(values, count);
  return out.some((v) => !Number.isFinite(v)) ? null : out;
}

/**
 * The compare values already in the delay line when a run starts from an idle operating point: for
 * each of the first d intervals, the bridge voltage of the idle steady state at the interval's
 * midpoint over the DC-link reference.
 *
 * @param op - the idle operating point (bridge voltage phasor).
 * @param design - the design (delay, DC-link reference, carrier counts, grid frequency).
 * @param samplePeriodS - Ts, s.
 * @param quantization - compare rounding.
 * @returns d compare pairs, oldest first.
 * @example
 * idleCompares(op, sc3, 5e-5, 'firmware'); // => [{ compareA: 1250 + ..., compareB: ... }]
 */
export function idleCompares(op: OperatingPoint, design: DesignInput, samplePeriodS: number, quantization: Quantization): { compareA: number; compareB: number }[] {
  const w0 = 2 * Math.PI * design.grid.frequencyHz;
  const counts = designSensing(design).carrierCounts;
  return Array.from({ length: design.sampling.computationDelaySamples }, (_, j) => {
    const t = (j + 0.5) * samplePeriodS;
    const vc = op.bridgeVoltage.re * Math.cos(w0 * t) - op.bridgeVoltage.im * Math.sin(w0 * t);
    return unipolarCompares(vc / design.dcLink.voltageRefV, counts, quantization);
  });
}

/** What may be plugged into a run besides the options. */
export interface SimulationHooks {
  /** The controller in the loop (default: the double-precision reference of the design), with what it is. */
  controller?: { controller: SampledController; kind: string; coefficients: string | null };
  /** Progress, fraction done in [0, 1]; may throw to stop the run. */
  progress?: (fraction: number) => void;
}

/**
 * Runs a scenario of CONTRACT section 10 on a design.
 *
 * @param design - a validated design.
 * @param analysis - its analysis (`analyzeDesign`; the controller's sections and the estimator settling time).
 * @param options - scenario, model, duration and the rest (see {@link defaultSimulationOptions}).
 * @param hooks - another controller in the loop, progress.
 * @returns the `varsmith-simulation/1` result.
 * @throws SimulationError `invalid-option` naming the option, `too-long` beyond the sample cap, `diverged`.
 * @example
 * simulateScenario(sc3, analysis, defaultSimulationOptions('steady')).metrics.gridPowerFactor; // => 0.9999
 */
export function simulateScenario(design: DesignInput, analysis: AnalysisResult, options: SimulationOptions, hooks: SimulationHooks = {}): SimulationResult {
  validate(design, options);
  const f0 = design.grid.frequencyHz;
  const samplePeriodS = analysis.sampleTimeS;
  const durationS = options.durationS ?? DEFAULT_DURATION_S[options.scenario];
  const samples = Math.round(durationS / samplePeriodS);
  const warmupS = warmupDurationS(design, analysis);
  const warmupSamples = Math.round(warmupS / samplePeriodS);
  if (samples + warmupSamples > SAMPLES_MAX) {
    throw new SimulationError('too-long', `durationS: ${samples + warmupSamples} samples (warm-up included) exceed the cap of ${SAMPLES_MAX}; shorten the run`, 'durationS');
  }
  const recordedS = samples * samplePeriodS;
  const warmS = warmupSamples * samplePeriodS;
  const scr = options.shortCircuitRatio === undefined ? design.envelope?.shortCircuitRatioMin ?? null : options.shortCircuitRatio;
  const plan = scenarioPlan(design, options.scenario, recordedS, samplePeriodS);
  const plant = designPlant(design, scr, plan.loads, options.rectifierPowerW);
  const layout = networkLayout(plant);
  const mode = { loadClosed: [...plan.initialClosed], rectifier: 'off' as const };
  const source: GridSource = {
    voltageRmsV: design.grid.voltageRmsV,
    harmonics: options.backgroundHarmonics,
    // Warm-up at the first segment; recorded segments shifted onto the run clock.
    segments: plan.segments.map((s, i) => ({ ...s, fromS: i === 0 ? 0 : s.fromS + warmS })),
  };
  const sensing = designSensing(design);
  const signals = resolveSignals(design);
  const bases = perUnitBases(design);
  const op = idleOperatingPoint(plant, layout, mode, design.grid.voltageRmsV, f0, design.dcLink.voltageRefV);
  const delay = design.sampling.computationDelaySamples;
  const w0 = 2 * Math.PI * f0;
  const initialCompares = idleCompares(op, design, samplePeriodS, options.quantization);
  const plugged = hooks.controller;
  const controller = plugged?.controller ?? createReferenceController(design, analysis, { coefficients: options.coefficients, quantization: options.quantization });
  controller.reset();
  const finalFrequencyHz = plan.segments[plan.segments.length - 1].frequencyHz;
  const windowS = METRIC_WINDOW_CYCLES / finalFrequencyHz;
  const windowStartS = recordedS - windowS;
  const record = runSystem({
    plant,
    source,
    sensing,
    switchingFrequencyHz: design.sampling.switchingFrequencyHz,
    updatesPerCarrier: design.sampling.updatesPerCarrier,
    computationDelaySamples: delay,
    model: options.model,
    quantization: options.quantization,
    controller,
    initialState: op.state,
    initialMode: mode,
    initialCompares,
    loadEvents: plan.loadEvents.map((e) => ({ ...e, atS: e.atS + warmS })),
    warmupSamples,
    samples,
    traceStride: Math.max(1, Math.ceil(samples / options.tracePoints)),
    windowStartS,
    nominalFrequencyHz: f0,
    progress: hooks.progress,
  });
  const lg = plant.grid.inductanceH;
  const { metrics, harmonicLimits } = computeMetrics(record, {
    windowStartS,
    windowEndS: recordedS,
    frequencyHz: finalFrequencyHz,
    nominalFrequencyHz: f0,
    ratedPeakCurrentA: bases.currentBaseA,
    currentLimitA: signals.currentReferencePeakA,
    dcReferenceV: design.dcLink.voltageRefV,
    eventTimeS: plan.eventTimeS,
    shortCircuitCurrentRmsA: lg > 0 ? design.grid.voltageRmsV / (w0 * lg) : null,
    harmonicTable: options.harmonicTable,
  });
  const tr = record.trace;
  const n = tr.count;
  const traces: SimulationTraces = {
    timeS: column(tr.timeS, n),
    gridVoltageV: column(tr.columns.gridVoltageV, n),
    gridCurrentA: column(tr.columns.gridCurrentA, n),
    inverterCurrentA: column(tr.columns.inverterCurrentA, n),
    loadCurrentA: column(tr.columns.loadCurrentA, n),
    dcLinkVoltageV: column(tr.columns.dcLinkVoltageV, n),
    pllFrequencyHz: optionalColumn(tr.columns.pllFrequencyHz, n),
    pllAngleErrorDeg: optionalColumn(tr.columns.pllAngleErrorDeg, n),
    reactiveCurrentEstimateA: optionalColumn(tr.columns.reactiveCurrentEstimateA, n),
    reactiveCurrentTrueA: column(tr.columns.reactiveCurrentTrueA, n),
    currentReferenceA: optionalColumn(tr.columns.currentReferenceA, n),
    modulationIndex: optionalColumn(tr.columns.modulationIndex, n),
  };
  const notes: string[] = [SIMULATION_SAFETY_NOTE];
  if (!plugged) {
    notes.push(`The controller in the loop is the double-precision reference of the control step (${options.coefficients === 'double' ? 'designed double coefficients' : 'the quantized coefficients of the set, run in double precision'}), not the bit-exact firmware step.`);
  }
  if (options.model === 'switched' && plant.grid.inductanceH > 0 && design.filter.topology === 'L') {
    notes.push('L filter on a weak grid, switched bridge: with no capacitance at the PCC in the model, the PCC voltage carries the switching pulses divided between the grid and filter inductances; the true power factor and the sampled grid voltage see them. Real installations have some capacitance there (EMI filter, cables).');
  }
  if (record.substepCapReached) notes.push('Some intervals needed more integration substeps than the cap allows: the stated step bound was not met there.');
  if (metrics.settling.note) notes.push(metrics.settling.note);
  const loadPower = finalLoadPower(plan, design.grid.voltageRmsV, f0);
  const lastSegment = plan.segments[plan.segments.length - 1];
  return {
    format: 'varsmith-simulation/1',
    scenario: options.scenario,
    model: options.model,
    durationS: recordedS,
    sampleTimeS: samplePeriodS,
    load: {
      activePowerW: loadPower.activePowerW + (options.rectifierPowerW ?? 0),
      reactivePowerVar: loadPower.reactivePowerVar,
      description: plan.description + (options.rectifierPowerW === null ? '' : ` Plus a diode-rectifier load of ${options.rectifierPowerW} W.`),
    },
    metrics,
    traces,
    design: design.name,
    controller: { kind: plugged?.kind ?? 'double-reference', coefficients: plugged ? plugged.coefficients : options.coefficients, quantization: options.quantization },
    grid: {
      shortCircuitRatio: scr,
      inductanceH: lg,
      initialFrequencyHz: f0,
      finalFrequencyHz,
      initialVoltageRmsV: design.grid.voltageRmsV,
      finalVoltageRmsV: design.grid.voltageRmsV * lastSegment.amplitudeScale,
      backgroundHarmonics: options.backgroundHarmonics,
    },
    eventTimeS: plan.eventTimeS,
    warmupS: warmS,
    window: { startS: windowStartS, endS: recordedS, cycles: METRIC_WINDOW_CYCLES },
    integrator: { method: 'trapezoidal', substepsPerSample: record.substepsPerSample, stepBoundRad: TRAPEZOID_STEP_RAD, capReached: record.substepCapReached },
    harmonicLimits,
    notes,
  };
}

