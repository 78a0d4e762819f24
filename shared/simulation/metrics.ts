/**
 * Metrics of a run over its window of whole grid cycles (CONTRACT section 10: the last 5).
 *
 * Powers at the PCC: P = mean(v i); fundamental reactive power Q1 = (1/2) Im(V1 conj(I1)) with V1, I1
 * the fundamental phasors (IEEE Std 1459-2010, fundamental reactive power, from memory); true power
 * factor P / (V_rms I_rms) (same standard). THD per IEEE Std 519 (see `thdPercent`). Every
 * integral is exact for the piecewise-linear recorded waveforms (see `fourier.ts`).
 */
import { compareHarmonics, type HarmonicLimitResult, type HarmonicTable } from './harmonicLimits';
import { extremes, fourierCoefficients, meanOfProduct, thdPercent } from './fourier';
import type { SystemRunRecord } from './engine';
import type { SimulationMetrics } from './types';

/** Highest harmonic order analysed (IEEE Std 519 THD runs to the 50th). */
export const MAX_HARMONIC_ORDER = 50;

/** Bands of the settling time, each around the signal's mean over the window (common practice, no source). */
export const SETTLING_BANDS = {
  /** DC-link one-cycle average within 1 % of the reference (the acceptance band of the DC-link mean). */
  dcLinkFractionOfReference: 0.01,
  /** Grid current along the cos template (the uncompensated reactive part) within 2 % of the rated peak current. */
  gridCosCurrentFractionOfRatedPeak: 0.02,
  /** PLL frequency one-cycle average within 0.1 % of nominal. */
  pllFrequencyFractionOfNominal: 0.001,
} as const;

/** What the metrics need besides the record. */
export interface MetricsContext {
  windowStartS: number;
  windowEndS: number;
  /** Grid frequency over the window, Hz. */
  frequencyHz: number;
  nominalFrequencyHz: number;
  ratedPeakCurrentA: number;
  currentLimitA: number;
  dcReferenceV: number;
  /** Scenario event on the recorded clock, s; null = steady (settling from 0). */
  eventTimeS: number | null;
  /** Short-circuit current at the PCC, A rms; null for a stiff grid. */
  shortCircuitCurrentRmsA: number | null;
  harmonicTable: HarmonicTable;
}

function phasorPower(v: { re: Float64Array; im: Float64Array }, i: { re: Float64Array; im: Float64Array }): { p: number; q: number } {
  // (1/2) V conj(I) with amplitude phasors.
  const re = 0.5 * (v.re[1] * i.re[1] + v.im[1] * i.im[1]);
  const im = 0.5 * (v.im[1] * i.re[1] - v.re[1] * i.im[1]);
  return { p: re, q: im };
}

function interpolateAt(timeS: ArrayLike<number>, values: ArrayLike<number>, count: number, at: number): number {
  if (count === 0) return 0;
  if (at <= timeS[0]) return values[0];
  for (let i = 1; i < count; i++) {
    if (timeS[i] >= at) {
      const span = timeS[i] - timeS[i - 1];
      return span > 0 ? values[i - 1] + ((values[i] - values[i - 1]) * (at - timeS[i - 1])) / span : values[i];
    }
  }
  return values[count - 1];
}

// Settling: last time any one-cycle average is outside its band (after the event), measured to the next recorded point.
function settlingTime(record: SystemRunRecord, ctx: MetricsContext): SimulationMetrics['settling'] & { value: number | null } {
  const from = ctx.eventTimeS ?? 0;
  const bands = [
    { signal: 'dcLinkVoltageV', band: SETTLING_BANDS.dcLinkFractionOfReference * ctx.dcReferenceV, unit: 'V' },
    { signal: 'gridCosCurrentA', band: SETTLING_BANDS.gridCosCurrentFractionOfRatedPeak * ctx.ratedPeakCurrentA, unit: 'A' },
    { signal: 'pllFrequencyHz', band: SETTLING_BANDS.pllFrequencyFractionOfNominal * ctx.nominalFrequencyHz, unit: 'Hz' },
  ];
  const s = record.settle;
  let lastOutside = -Infinity;
  const used: typeof bands = [];
  for (const b of bands) {
    const col = s.columns[b.signal];
    let sum = 0;
    let n = 0;
    for (let i = 0; i < s.count; i++) if (s.timeS[i] >= ctx.windowStartS) { sum += col[i]; n += 1; }
    if (n === 0 || !Number.isFinite(sum)) continue;
    used.push(b);
    const final = sum / n;
    for (let i = 0; i < s.count; i++) {
      if (s.timeS[i] >= from && Math.abs(col[i] - final) > b.band) lastOutside = Math.max(lastOutside, s.timeS[i]);
    }
  }
  if (lastOutside === -Infinity) return { value: 0, fromS: from, bands: used, note: null };
  if (lastOutside >= ctx.windowStartS) {
    return { value: null, fromS: from, bands: used, note: 'A monitored one-cycle average is still outside its band inside the metrics window: the run did not settle; lengthen it.' };
  }
  let next = lastOutside;
  for (let i = 0; i < s.count; i++) if (s.timeS[i] > lastOutside) { next = s.timeS[i]; break; }
  return { value: next - from, fromS: from, bands: used, note: null };
}

/**
 * The metrics of CONTRACT section 10 and the harmonic comparison, from a run's record.
 *
 * @param record - what the run recorded.
 * @param ctx - window, frequencies, ratings, event time, grid strength, table.
 * @returns the metrics and the harmonic-limit comparison.
 * @example
 * computeMetrics(record, ctx).metrics.gridPowerFactor; // => 0.999
 */
export function computeMetrics(record: SystemRunRecord, ctx: MetricsContext): { metrics: SimulationMetrics; harmonicLimits: HarmonicLimitResult } {
  const w = record.window;
  const col = w.columns;
  const t0 = ctx.windowStartS;
  const t1 = ctx.windowEndS;
  const f = ctx.frequencyHz;
  const grid = fourierCoefficients(w, col.gridCurrentA, f, MAX_HARMONIC_ORDER, t0, t1);
  const pcc = fourierCoefficients(w, col.pccVoltageV, f, 1, t0, t1);
  const load = fourierCoefficients(w, col.loadCurrentA, f, 1, t0, t1);
  const filter = fourierCoefficients(w, col.filterCurrentA, f, 1, t0, t1);
  const amplitudes = new Float64Array(MAX_HARMONIC_ORDER + 1);
  for (let h = 1; h <= MAX_HARMONIC_ORDER; h++) amplitudes[h] = Math.hypot(grid.re[h], grid.im[h]);
  const thd = thdPercent(amplitudes);
  const harmonicsPercent: Record<string, number> = {};
  for (let h = 2; h <= MAX_HARMONIC_ORDER; h++) harmonicsPercent[String(h)] = amplitudes[1] > 0 ? (100 * amplitudes[h]) / amplitudes[1] : 0;
  const gridActivePowerW = meanOfProduct(w, col.pccVoltageV, col.gridCurrentA, t0, t1);
  const loadActivePowerW = meanOfProduct(w, col.pccVoltageV, col.loadCurrentA, t0, t1);
  const vRms = Math.sqrt(meanOfProduct(w, col.pccVoltageV, col.pccVoltageV, t0, t1));
  const iRms = Math.sqrt(meanOfProduct(w, col.gridCurrentA, col.gridCurrentA, t0, t1));
  const ones = new Float64Array(w.count).fill(1);
  const dcLinkMeanV = meanOfProduct(w, col.dcLinkVoltageV, ones, t0, t1);
  const dc = extremes(w, col.dcLinkVoltageV, t0, t1);
  const inv = extremes(w, col.inverterCurrentA, t0, t1);
  const lossW = meanOfProduct(w, col.converterLossW, ones, t0, t1);
  const energyRate = (interpolateAt(w.timeS, col.converterEnergyJ, w.count, t1) - interpolateAt(w.timeS, col.converterEnergyJ, w.count, t0)) / (t1 - t0);
  const gridQ = phasorPower(pcc, grid).q;
  const loadQ = phasorPower(pcc, load).q;
  const unitQ = phasorPower(pcc, filter).q;
  let tracking: number | null = null;
  if (record.tracking.count > 1) {
    const e = fourierCoefficients(record.tracking, record.tracking.columns.errorA, f, 1, Math.max(t0, record.tracking.timeS[0]), t1 - record.samplePeriodS);
    tracking = (100 * Math.hypot(e.re[1], e.im[1])) / ctx.ratedPeakCurrentA;
  }
  const settling = settlingTime(record, ctx);
  const shortCircuit = ctx.shortCircuitCurrentRmsA;
  const harmonicLimits = compareHarmonics(ctx.harmonicTable, amplitudes, thd, shortCircuit);
  const metrics: SimulationMetrics = {
    gridPowerFactor: vRms > 0 && iRms > 0 ? gridActivePowerW / (vRms * iRms) : null,
    gridActivePowerW,
    gridReactivePowerVar: gridQ,
    loadReactivePowerVar: loadQ,
    gridCurrentThdPercent: thd,
    gridCurrentHarmonicsPercent: harmonicsPercent,
    dcLinkMeanV,
    dcLinkRipplePeakToPeakV: dc.max - dc.min,
    peakInverterCurrentA: Math.max(Math.abs(inv.min), Math.abs(inv.max)),
    pllFrequencyHz: record.pllFrequencyWindowMeanHz,
    settlingTimeS: settling.value,
    loadActivePowerW,
    unitReactivePowerVar: unitQ,
    gridCurrentFundamentalRmsA: amplitudes[1] / Math.SQRT2,
    pccVoltageRmsV: vRms,
    pccVoltageFundamentalRmsV: Math.hypot(pcc.re[1], pcc.im[1]) / Math.SQRT2,
    currentLimitA: ctx.currentLimitA,
    peakInverterCurrentRunA: record.peakInverterCurrentRunA,
    fundamentalTrackingErrorPercent: tracking,
    settling: { fromS: settling.fromS, bands: settling.bands, note: settling.note },
    energyBalance: {
      gridActivePowerW,
      loadActivePowerW,
      converterLossW: lossW,
      storedEnergyRateW: energyRate,
      residualW: gridActivePowerW - loadActivePowerW - lossW - energyRate,
    },
  };
  return { metrics, harmonicLimits };
}
