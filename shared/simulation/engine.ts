/**
 * The closed loop, sample by sample: the plant is sensed at each sample instant (ADC codes), the
 * controller computes its compare values, and they drive the bridge after the computation delay,
 * as the firmware's timer does it.
 *
 * Timing (centre-aligned PWM, up-down counter 0 -> N -> 0 per carrier period 1/f_sw): the samples
 * are taken at the counter's valley (one update per carrier) or at valley and peak (two updates),
 * where the inverter current equals its switching-period average. Compare values written by the
 * step of sample k are loaded at update event k + d (d = computation delay in samples; d = 1 is
 * "load at the next update"), and hold until the next load. A leg is high while the counter is
 * below its compare value.
 *
 * Bridge models: `averaged` applies each interval's duty difference m = (cA - cB) / N to the bridge
 * (v_bridge = m v_dc); `switched` applies the leg states themselves, switching at the counter ticks
 * where the counter crosses the compare values (carrier resolution: 1 tick = 1 / (2 N f_sw)).
 * The warm-up before the recorded run always uses the averaged model.
 */
import type { AdcCodes, SampledController } from './controller';
import { SimulationError } from './errors';
import { SourceWaveform, type GridSource } from './grid';
import { SUBSTEPS_MAX, TrapezoidalIntegrator } from './integrator';
import {
  converterLossW, converterStoredEnergyJ, evaluateNetwork, networkLayout, OUTPUT, OUTPUT_BASE_COUNT, projectConsistent,
  type NetworkLayout, type NetworkMode, type PlantConfig,
} from './network';
import { adcCode, legDuty, type Quantization, type Sensing } from './sensing';

/** Bridge model: duty-averaged over each update interval, or switched at carrier resolution. */
export type BridgeModel = 'averaged' | 'switched';

/** A load branch closing, or opening at its next current zero (as an AC breaker interrupts), at a time. */
export interface LoadSwitchEvent {
  branch: number;
  action: 'close' | 'open-at-current-zero';
  /** Time on the run clock (0 = start of the warm-up), s; applied at the first sample at or after it. */
  atS: number;
}

/** Everything one closed-loop run needs. Times are on the run clock: 0 at the start of the warm-up. */
export interface SystemRunConfig {
  plant: PlantConfig;
  source: GridSource;
  sensing: Sensing;
  switchingFrequencyHz: number;
  updatesPerCarrier: number;
  computationDelaySamples: number;
  model: BridgeModel;
  quantization: Quantization;
  controller: SampledController;
  /** Plant state at the start (see `networkLayout`). */
  initialState: Float64Array;
  initialMode: NetworkMode;
  /** Compare values in the delay line at the start, oldest first (length = computation delay). */
  initialCompares: { compareA: number; compareB: number }[];
  loadEvents: LoadSwitchEvent[];
  /** Samples before the recorded run (averaged model, not recorded). */
  warmupSamples: number;
  /** Recorded samples. */
  samples: number;
  /** Record every this many samples into the traces. */
  traceStride: number;
  /** Metrics window start on the recorded clock (0 = end of warm-up), s; the window ends with the run. */
  windowStartS: number;
  /** Nominal grid frequency (length of the one-cycle moving averages), Hz. */
  nominalFrequencyHz: number;
  /** Called now and then with the fraction done; may throw to stop the run. */
  progress?: (fraction: number) => void;
  /** Fewest integration substeps per interval (default 1; more only for convergence studies). */
  substepsMin?: number;
}

/** Growable columns of (t, signals) points. */
export class PointColumns {
  /** Number of points in use. */
  count = 0;
  /** Times, s. */
  timeS: Float64Array;
  /** One column per signal name. */
  readonly columns: Record<string, Float64Array>;

  /**
   * @param names - signal names.
   * @param capacity - initial capacity.
   */
  constructor(readonly names: readonly string[], capacity = 1024) {
    this.timeS = new Float64Array(capacity);
    this.columns = {};
    for (const n of names) this.columns[n] = new Float64Array(capacity);
  }

  /**
   * Appends a point.
   * @param timeS - t, s.
   * @param values - one value per name, in order.
   */
  push(timeS: number, values: ArrayLike<number>): void {
    if (this.count === this.timeS.length) {
      const grow = (a: Float64Array): Float64Array => { const b = new Float64Array(a.length * 2); b.set(a); return b; };
      this.timeS = grow(this.timeS);
      for (const n of this.names) this.columns[n] = grow(this.columns[n]);
    }
    this.timeS[this.count] = timeS;
    for (let i = 0; i < this.names.length; i++) this.columns[this.names[i]][this.count] = values[i];
    this.count += 1;
  }
}

/** Signals recorded at every integration point of the metrics window. */
export const WINDOW_SIGNALS = ['pccVoltageV', 'gridCurrentA', 'loadCurrentA', 'inverterCurrentA', 'filterCurrentA', 'dcLinkVoltageV', 'converterLossW', 'converterEnergyJ'] as const;

/** Signals recorded every trace stride (controller ones NaN when the controller does not log them). */
export const TRACE_SIGNALS = [
  'gridVoltageV', 'gridCurrentA', 'inverterCurrentA', 'loadCurrentA', 'dcLinkVoltageV', 'pllFrequencyHz', 'pllAngleErrorDeg',
  'reactiveCurrentEstimateA', 'reactiveCurrentTrueA', 'currentReferenceA', 'modulationIndex',
] as const;

/** One-cycle moving averages recorded for the settling time. */
export const SETTLE_SIGNALS = ['dcLinkVoltageV', 'gridCosCurrentA', 'pllFrequencyHz'] as const;

/** What a run records; metrics are computed from it. */
export interface SystemRunRecord {
  samplePeriodS: number;
  /** Start of the recorded run on the run clock, s. */
  recordStartS: number;
  /** Decimated traces on the recorded clock. */
  trace: PointColumns;
  /** Every integration point inside (and just before) the metrics window, recorded clock. */
  window: PointColumns;
  /** One-cycle moving averages (every 1/8 cycle), recorded clock. */
  settle: PointColumns;
  /** Inverter-current tracking error i_ref - i at the samples inside the window (when the controller logs i_ref). */
  tracking: PointColumns;
  /** Mean of the logged PLL frequency over the window's samples, Hz (null when not logged). */
  pllFrequencyWindowMeanHz: number | null;
  /** Largest |inverter current| over the recorded run at integration points, A. */
  peakInverterCurrentRunA: number;
  /** An interval needed more substeps than the cap allows. */
  substepCapReached: boolean;
  /** Substeps per sample of the averaged model in the initial mode. */
  substepsPerSample: number;
  /** Source frequency at the end of the run, Hz. */
  finalFrequencyHz: number;
}

/** Largest magnitude of a plant state before a run is declared diverged (A or V). */
export const DIVERGENCE_LIMIT = 1e7;

function wrapDeg(angleRad: number): number {
  let d = (angleRad * 180) / Math.PI;
  d -= 360 * Math.round(d / 360);
  return d;
}

/** A one-cycle moving average over a circular buffer. */
class MovingAverage {
  private readonly buffer: Float64Array;
  private index = 0;
  private filled = 0;
  private sum = 0;

  constructor(length: number) { this.buffer = new Float64Array(Math.max(1, length)); }

  push(v: number): number {
    const n = this.buffer.length;
    this.sum += v - this.buffer[this.index];
    this.buffer[this.index] = v;
    this.index = (this.index + 1) % n;
    if (this.filled < n) this.filled += 1;
    // Re-sum now and then so rounding does not drift.
    if (this.index === 0) { this.sum = 0; for (let i = 0; i < n; i++) this.sum += this.buffer[i]; }
    return this.sum / this.filled;
  }
}

/**
 * Runs the closed loop.
 *
 * @param config - plant, source, sensing, PWM timing, controller, initial state, events, lengths.
 * @returns what was recorded (traces, metrics-window points, moving averages).
 * @throws SimulationError `diverged` when a state leaves +-{@link DIVERGENCE_LIMIT}; whatever `progress` throws.
 * @example
 * const record = runSystem(config);
 * record.window.count; // => integration points in the metrics window
 */
export function runSystem(config: SystemRunConfig): SystemRunRecord {
  return new SystemRun(config).run();
}

class SystemRun {
  private readonly layout: NetworkLayout;
  private readonly wave: SourceWaveform;
  private readonly integrator: TrapezoidalIntegrator;
  private readonly x: Float64Array;
  private readonly y: Float64Array;
  private readonly mode: NetworkMode;
  private readonly armed: boolean[];
  private readonly branchCurrent: Float64Array;
  private readonly samplePeriodS: number;
  private readonly halfCarrierS: number;
  private readonly tickS: number;
  private readonly recordStartS: number;
  private readonly windowStartRunS: number;
  private readonly windowValues = new Float64Array(WINDOW_SIGNALS.length);
  private readonly record: SystemRunRecord;
  private recordWindow = false;
  private bridgeRatio = 0;
  private peakInverter = 0;
  private readonly cycleSamples: number;
  private readonly settleStride: number;
  private readonly averages: { dc: MovingAverage; gridCos: MovingAverage; loadCos: MovingAverage; pll: MovingAverage };
  private readonly traceValues = new Float64Array(TRACE_SIGNALS.length);
  private readonly settleValues = new Float64Array(SETTLE_SIGNALS.length);
  private readonly trackingValue = new Float64Array(1);
  private pllSum = 0;
  private pllCount = 0;
  private pllLogged = true;

  constructor(private readonly c: SystemRunConfig) {
    this.layout = networkLayout(c.plant);
    this.wave = new SourceWaveform(c.source);
    if (c.substepsMin !== undefined && !(Number.isInteger(c.substepsMin) && c.substepsMin >= 1 && c.substepsMin <= SUBSTEPS_MAX)) {
      throw new SimulationError('invalid-option', `substepsMin must be an integer from 1 to ${SUBSTEPS_MAX}`, 'substepsMin');
    }
    this.integrator = new TrapezoidalIntegrator(c.plant, this.layout, this.wave.maxAngularFrequencyRadPerS(), c.substepsMin ?? 1);
    this.x = Float64Array.from(c.initialState);
    this.y = new Float64Array(OUTPUT_BASE_COUNT + c.plant.loads.length);
    this.mode = { loadClosed: [...c.initialMode.loadClosed], rectifier: c.initialMode.rectifier };
    this.armed = c.plant.loads.map(() => false);
    this.branchCurrent = new Float64Array(c.plant.loads.length);
    this.samplePeriodS = 1 / (c.switchingFrequencyHz * c.updatesPerCarrier);
    this.halfCarrierS = 1 / (2 * c.switchingFrequencyHz);
    this.tickS = this.halfCarrierS / c.sensing.carrierCounts;
    this.recordStartS = c.warmupSamples * this.samplePeriodS;
    this.windowStartRunS = this.recordStartS + c.windowStartS;
    this.cycleSamples = Math.max(1, Math.round(1 / (c.nominalFrequencyHz * this.samplePeriodS)));
    this.settleStride = Math.max(1, Math.round(this.cycleSamples / 8));
    const avg = (): MovingAverage => new MovingAverage(this.cycleSamples);
    this.averages = { dc: avg(), gridCos: avg(), loadCos: avg(), pll: avg() };
    this.record = {
      samplePeriodS: this.samplePeriodS,
      recordStartS: this.recordStartS,
      trace: new PointColumns(TRACE_SIGNALS, Math.ceil(c.samples / c.traceStride) + 2),
      window: new PointColumns(WINDOW_SIGNALS, 4096),
      settle: new PointColumns(SETTLE_SIGNALS, 256),
      tracking: new PointColumns(['errorA'], 1024),
      pllFrequencyWindowMeanHz: null,
      peakInverterCurrentRunA: 0,
      substepCapReached: false,
      substepsPerSample: 0,
      finalFrequencyHz: this.wave.frequencyHz((c.warmupSamples + c.samples) * this.samplePeriodS),
    };
    projectConsistent(c.plant, this.layout, this.mode, this.x);
    this.integrator.setMode(this.mode);
    this.record.substepsPerSample = this.integrator.substeps(this.samplePeriodS);
  }

  // Applies a mode change: constraints, the integrator's matrices, fresh branch currents for the current-zero detection.
  private modeChanged(vs: number): void {
    projectConsistent(this.c.plant, this.layout, this.mode, this.x);
    this.integrator.setMode(this.mode);
    evaluateNetwork(this.c.plant, this.layout, this.mode, this.x, vs, this.bridgeRatio, null, this.y);
    for (let b = 0; b < this.branchCurrent.length; b++) this.branchCurrent[b] = this.y[OUTPUT_BASE_COUNT + b];
  }

  run(): SystemRunRecord {
    const c = this.c;
    const Ts = this.samplePeriodS;
    const total = c.warmupSamples + c.samples;
    const s = c.sensing;
    const delay = c.computationDelaySamples;
    const queue = c.initialCompares.map((q) => ({ ...q }));
    const events = [...c.loadEvents].sort((a, b) => a.atS - b.atS);
    let nextEvent = 0;
    const codes: AdcCodes = { inverterCurrent: 0, loadCurrent: 0, gridVoltage: 0, dcVoltage: 0 };
    const progressEvery = 4096;
    for (let k = 0; k < total; k++) {
      const tau = k * Ts;
      const vs = this.wave.voltageV(tau);
      if (nextEvent < events.length && events[nextEvent].atS <= tau + 1e-12) {
        while (nextEvent < events.length && events[nextEvent].atS <= tau + 1e-12) {
          const ev = events[nextEvent++];
          if (ev.action === 'close') { this.mode.loadClosed[ev.branch] = true; this.armed[ev.branch] = false; } else this.armed[ev.branch] = true;
        }
        this.modeChanged(vs);
      }
      evaluateNetwork(c.plant, this.layout, this.mode, this.x, vs, this.bridgeRatio, null, this.y);
      const y = this.y;
      codes.inverterCurrent = adcCode(y[OUTPUT.inverterCurrent], s.currentAPerCode, s, c.quantization);
      codes.loadCurrent = adcCode(y[OUTPUT.loadCurrent], s.currentAPerCode, s, c.quantization);
      codes.gridVoltage = adcCode(y[OUTPUT.pccVoltage], s.gridVoltageVPerCode, s, c.quantization);
      codes.dcVoltage = adcCode(y[OUTPUT.dcVoltage], s.dcVoltageVPerCode, s, c.quantization);
      const out = c.controller.step(codes);
      let applied: { compareA: number; compareB: number } = out;
      if (delay > 0) { queue.push({ compareA: out.compareA, compareB: out.compareB }); applied = queue.shift() ?? out; }

      const recorded = k >= c.warmupSamples;
      // The one-cycle averages run through the last cycle of the warm-up, so they are full at t = 0.
      if (k + this.cycleSamples >= c.warmupSamples) this.recordSample(k, tau, out.log);
      this.recordWindow = tau + Ts >= this.windowStartRunS - 1e-12;
      const compareA = Math.min(s.carrierCounts, Math.max(0, applied.compareA));
      const compareB = Math.min(s.carrierCounts, Math.max(0, applied.compareB));
      if (!recorded || c.model === 'averaged') {
        this.integrateInterval(tau, Ts, legDuty(compareA, s.carrierCounts) - legDuty(compareB, s.carrierCounts));
      } else {
        const halves = Math.round(Ts / this.halfCarrierS);
        for (let hIdx = 0; hIdx < halves; hIdx++) {
          const up = c.updatesPerCarrier === 1 ? hIdx === 0 : k % 2 === 0;
          this.integrateHalfCarrier(tau + hIdx * this.halfCarrierS, up, compareA, compareB);
        }
      }
      if (!Number.isFinite(this.x[this.layout.dcVoltage]) || Math.abs(this.x[this.layout.inverterCurrent]) > DIVERGENCE_LIMIT
        || Math.abs(this.x[this.layout.dcVoltage]) > DIVERGENCE_LIMIT) {
        throw new SimulationError('diverged', `the closed loop diverged at t = ${(tau - this.recordStartS).toFixed(4)} s (a plant state passed ${DIVERGENCE_LIMIT})`);
      }
      if (c.progress && k % progressEvery === 0) c.progress(k / total);
    }
    if (c.progress) c.progress(1);
    this.record.pllFrequencyWindowMeanHz = this.pllLogged && this.pllCount > 0 ? this.pllSum / this.pllCount : null;
    this.record.peakInverterCurrentRunA = this.peakInverter;
    this.record.substepCapReached = this.integrator.capped;
    return this.record;
  }

  // Per-sample bookkeeping: one-cycle averages, and (after the warm-up) settling points, window means, traces.
  private recordSample(k: number, tau: number, log: Record<string, number>): void {
    const c = this.c;
    const y = this.y;
    const j = k - c.warmupSamples;
    const t = tau - this.recordStartS;
    const thetaS = this.wave.angleRad(tau);
    const cosS = Math.cos(thetaS);
    const av = this.averages;
    const loadCos = av.loadCos.push(2 * y[OUTPUT.loadCurrent] * cosS);
    const gridCos = av.gridCos.push(2 * y[OUTPUT.gridCurrent] * cosS);
    const dcAvg = av.dc.push(y[OUTPUT.dcVoltage]);
    const pllHz = log.pllFrequencyHz;
    if (pllHz === undefined) this.pllLogged = false;
    const pllAvg = av.pll.push(pllHz ?? 0);
    if (j < 0) return;
    if (j % this.settleStride === 0) {
      const v = this.settleValues;
      v[0] = dcAvg; v[1] = gridCos; v[2] = this.pllLogged ? pllAvg : NaN;
      this.record.settle.push(t, v);
    }
    if (t >= c.windowStartS - 1e-12) {
      if (pllHz !== undefined) { this.pllSum += pllHz; this.pllCount += 1; }
      if (log.currentReferenceA !== undefined) {
        this.trackingValue[0] = log.currentReferenceA - y[OUTPUT.inverterCurrent];
        this.record.tracking.push(t, this.trackingValue);
      }
    }
    if (j % c.traceStride === 0) {
      const v = this.traceValues;
      v[0] = y[OUTPUT.pccVoltage];
      v[1] = y[OUTPUT.gridCurrent];
      v[2] = y[OUTPUT.inverterCurrent];
      v[3] = y[OUTPUT.loadCurrent];
      v[4] = y[OUTPUT.dcVoltage];
      v[5] = pllHz ?? NaN;
      v[6] = log.pllAngleRad === undefined ? NaN : wrapDeg(log.pllAngleRad - thetaS);
      v[7] = log.reactiveCurrentEstimateA ?? NaN;
      v[8] = loadCos;
      v[9] = log.currentReferenceA ?? NaN;
      v[10] = log.modulationIndex ?? NaN;
      this.record.trace.push(t, v);
    }
  }

  // Integrates [t0, t0 + span] with a constant bridge ratio m, in equal substeps.
  private integrateInterval(t0: number, span: number, m: number): void {
    this.bridgeRatio = m;
    if (this.recordWindow) this.pushWindowPoint(t0);
    const substeps = this.integrator.substeps(span);
    const h = span / substeps;
    let vsA = this.wave.voltageV(t0);
    let prepared = false;
    for (let i = 0; i < substeps; i++) {
      const ta = t0 + i * h;
      const tb = i === substeps - 1 ? t0 + span : ta + h;
      if (this.startRectifier(vsA)) prepared = false;
      if (!prepared) { this.integrator.prepare(m, h); prepared = true; }
      const vsB = this.wave.voltageV(tb);
      this.integrator.step(this.x, vsA, vsB);
      if (this.afterStep(tb, vsB)) prepared = false;
      vsA = vsB;
    }
  }

  // Integrates one half carrier period: up-counting (counter 0 -> N) or down-counting, legs switching at their compare ticks.
  private integrateHalfCarrier(t0: number, up: boolean, compareA: number, compareB: number): void {
    const n = this.c.sensing.carrierCounts;
    const edgeA = up ? compareA : n - compareA;
    const edgeB = up ? compareB : n - compareB;
    const lo = Math.min(edgeA, edgeB);
    const hi = Math.max(edgeA, edgeB);
    const bounds = [0, lo, hi, n];
    for (let i = 0; i < 3; i++) {
      const p = bounds[i];
      const q = bounds[i + 1];
      if (!(q > p)) continue;
      const mid = (p + q) / 2;
      const legA = up ? mid < compareA : mid > n - compareA;
      const legB = up ? mid < compareB : mid > n - compareB;
      const m = (legA ? 1 : 0) - (legB ? 1 : 0);
      // Span from the tick count alone, so equal spans are equal numbers (their factorizations are cached).
      this.integrateInterval(t0 + p * this.tickS, (q - p) * this.tickS, m);
    }
  }

  // Starts rectifier conduction when the PCC voltage exceeds the DC capacitor voltage; true when the mode changed.
  private startRectifier(vs: number): boolean {
    const rect = this.c.plant.rectifier;
    if (!rect || this.mode.rectifier !== 'off') return false;
    evaluateNetwork(this.c.plant, this.layout, this.mode, this.x, vs, this.bridgeRatio, null, this.y);
    const vp = this.y[OUTPUT.pccVoltage];
    const vr = this.x[this.layout.rectifierVoltage];
    if (vp > vr) this.mode.rectifier = 'positive';
    else if (vp < -vr) this.mode.rectifier = 'negative';
    else return false;
    this.modeChanged(vs);
    return true;
  }

  // After a step ending at tb: current-zero events (rectifier diodes turning off, breakers of armed
  // branches opening), then recording. Returns true when the mode changed.
  private afterStep(tb: number, vs: number): boolean {
    const c = this.c;
    let changed = false;
    const rect = c.plant.rectifier;
    if (rect && this.mode.rectifier !== 'off') {
      const ir = this.x[this.layout.rectifierCurrent];
      if ((this.mode.rectifier === 'positive' && ir <= 0) || (this.mode.rectifier === 'negative' && ir >= 0)) {
        this.mode.rectifier = 'off';
        changed = true;
      }
    }
    const anyArmed = this.armed.some((a) => a);
    if (anyArmed || changed || this.recordWindow) {
      evaluateNetwork(c.plant, this.layout, this.mode, this.x, vs, this.bridgeRatio, null, this.y);
      for (let b = 0; b < this.armed.length; b++) {
        const now = this.y[OUTPUT_BASE_COUNT + b];
        if (this.armed[b] && this.mode.loadClosed[b] && (now === 0 || Math.sign(now) !== Math.sign(this.branchCurrent[b]))) {
          this.mode.loadClosed[b] = false;
          this.armed[b] = false;
          changed = true;
        }
        this.branchCurrent[b] = now;
      }
    }
    if (changed) this.modeChanged(vs);
    const i1 = Math.abs(this.x[this.layout.inverterCurrent]);
    if (tb >= this.recordStartS && i1 > this.peakInverter) this.peakInverter = i1;
    if (this.recordWindow) this.pushWindowPoint(tb);
    return changed;
  }

  private pushWindowPoint(timeS: number): void {
    const c = this.c;
    evaluateNetwork(c.plant, this.layout, this.mode, this.x, this.wave.voltageV(timeS), this.bridgeRatio, null, this.y);
    const v = this.windowValues;
    v[0] = this.y[OUTPUT.pccVoltage];
    v[1] = this.y[OUTPUT.gridCurrent];
    v[2] = this.y[OUTPUT.loadCurrent];
    v[3] = this.y[OUTPUT.inverterCurrent];
    v[4] = this.y[OUTPUT.filterCurrent];
    v[5] = this.y[OUTPUT.dcVoltage];
    v[6] = converterLossW(c.plant, this.layout, this.x);
    v[7] = converterStoredEnergyJ(c.plant, this.layout, this.x);
    this.record.window.push(timeS - this.recordStartS, v);
  }
}
