/**
 * Plant checks (DESIGN pipeline step 1): rated current, inductor drop, switching ripple, DC-link
 * ripple and headroom, LCL resonance placement, estimator attenuation and settling.
 */
import { forEachStepSample, sectionResponse, type SectionPair } from './blocks';
import { totalInductanceH } from './designRules';
import { lclResonanceHz as lclResonanceOf } from './filterSizing';
import type { Check, DesignInput } from './types';

/** Usual inductor drop at rated current, fraction of grid voltage (common practice, no source). */
export const INDUCTOR_DROP_TARGET = 0.05;
/** Drop above which the modulator headroom suffers (twice the usual target; common practice, no source). */
export const INDUCTOR_DROP_LIMIT = 0.1;
/** Peak-to-peak switching ripple limit, fraction of rated peak current (common practice 10–40 %, no source). */
export const RIPPLE_LIMIT_FRACTION = 0.4;
/** Modulator margin on the minimum DC-link voltage (common practice, no source). */
export const DC_LINK_MARGIN = 0.05;
/** Minimum attenuation of the 2ω ripple by the reactive estimator, dB (common practice, no source). */
export const ESTIMATOR_ATTENUATION_LIMIT_DB = 20;
/** LCL capacitor reactive power limit, fraction of rating (Liserre, Blaabjerg & Hansen, IEEE TIA 41(5), 2005). */
export const LCL_CAPACITOR_REACTIVE_LIMIT = 0.05;
/** Third-harmonic current limit, fraction of rated current (IEEE 1547 odd harmonics below the 11th, 4 %; from memory). */
export const THIRD_HARMONIC_LIMIT = 0.04;
/** Minimum ratio of current-loop to voltage-loop crossover (common practice, no source). */
export const BANDWIDTH_SEPARATION_MIN = 10;

/** Plant summary values, SI. */
export interface PlantSummary {
  ratedCurrentA: number;
  ratedPeakCurrentA: number;
  totalInductanceH: number;
  inductorDropFraction: number;
  rippleCurrentPeakToPeakA: number;
  rippleFractionOfPeak: number;
  dcLinkRipplePeakToPeakV: number;
  minimumDcLinkVoltageV: number;
  dcLinkHeadroomV: number;
  lclResonanceHz: number | null;
  lclCapacitorReactiveFraction: number | null;
  estimatorAttenuationDb: number;
  estimatorSettlingTimeS: number | null;
}

/**
 * 2 % settling time of a section's unit step response, from a double-precision simulation.
 *
 * @param section - b and a in powers of z^-1 (unity DC gain expected).
 * @param samplePeriodS - Ts, s.
 * @param horizonS - longest simulated time, s.
 * @returns the last time the response is outside ±2 % of its final value, s; null when it has not settled within the horizon.
 * @example
 * stepSettlingTimeS({ b: [0.5, 0, 0], a: [1, -0.5, 0] }, 1, 100); // => 5
 */
export function stepSettlingTimeS(section: SectionPair | { b: readonly number[]; a: readonly number[] }, samplePeriodS: number, horizonS: number): number | null {
  const n = Math.min(Math.ceil(horizonS / samplePeriodS), 5_000_000);
  const finalValue = (section.b[0] + section.b[1] + section.b[2]) / (section.a[0] + section.a[1] + section.a[2]);
  if (!Number.isFinite(finalValue)) return null;
  let lastOutside = -1;
  forEachStepSample(section, n, (i, y) => {
    if (Math.abs(y - finalValue) > 0.02 * Math.abs(finalValue)) lastOutside = i;
  });
  if (lastOutside >= n - 1) return null;
  return (lastOutside + 1) * samplePeriodS;
}

/**
 * Plant summary and its checks.
 *
 * Formulas: rated current S/V; drop w0 L I / V; unipolar worst-case ripple Vdc/(8 L fsw) (Holmes & Lipo,
 * "Pulse Width Modulation for Power Converters", 2003, from memory); DC-link 2ω ripple
 * ΔV_peak = S/(2 w0 C Vdc) (Kjaer, Pedersen & Blaabjerg, IEEE TIA 41(5), 2005); minimum DC link
 * sqrt(2)(V + w0 L I) (capacitive reactive current, full bridge); LCL resonance
 * sqrt((L1+L2)/(L1 L2 Cf))/(2 pi), placed in (10 f0, fs/2) (Liserre, Blaabjerg & Hansen 2005).
 *
 * @param design - validated design.
 * @param estimator - the reactive-estimator low-pass section.
 * @param samplePeriodS - Ts, s.
 * @returns `{ summary, checks }`.
 */
export function plantChecks(design: DesignInput, estimator: SectionPair, samplePeriodS: number): { summary: PlantSummary; checks: Check[] } {
  const checks: Check[] = [];
  const v = design.grid.voltageRmsV;
  const f0 = design.grid.frequencyHz;
  const w0 = 2 * Math.PI * f0;
  const s = design.rating.apparentPowerVA;
  const ratedCurrentA = s / v;
  const ratedPeakCurrentA = Math.SQRT2 * ratedCurrentA;
  const lTotal = totalInductanceH(design.filter);
  const lInverter = design.filter.topology === 'L' ? design.filter.inductanceH : design.filter.inverterInductanceH;
  const vdc = design.dcLink.voltageRefV;
  const fsw = design.sampling.switchingFrequencyHz;
  const sampleRateHz = 1 / samplePeriodS;

  const inductorDropFraction = (w0 * lTotal * ratedCurrentA) / v;
  checks.push({
    id: 'plant-inductor-drop',
    severity: inductorDropFraction > INDUCTOR_DROP_LIMIT ? 'warning' : 'info',
    message: `Inductor drop at rated current is ${(inductorDropFraction * 100).toFixed(2)} % of grid voltage (usual target 5 %).`,
    value: inductorDropFraction, limit: INDUCTOR_DROP_LIMIT, unit: 'fraction',
    remedy: inductorDropFraction > INDUCTOR_DROP_LIMIT ? 'Use a smaller inductance or a higher DC-link voltage.' : null,
  });

  const rippleCurrentPeakToPeakA = vdc / (8 * lInverter * fsw);
  const rippleFractionOfPeak = rippleCurrentPeakToPeakA / ratedPeakCurrentA;
  checks.push({
    id: 'plant-switching-ripple',
    severity: rippleFractionOfPeak > RIPPLE_LIMIT_FRACTION ? 'warning' : 'info',
    message: `Worst-case unipolar switching ripple is ${rippleCurrentPeakToPeakA.toFixed(3)} A peak to peak (${(rippleFractionOfPeak * 100).toFixed(1)} % of rated peak current).`,
    value: rippleCurrentPeakToPeakA, limit: RIPPLE_LIMIT_FRACTION * ratedPeakCurrentA, unit: 'A',
    remedy: rippleFractionOfPeak > RIPPLE_LIMIT_FRACTION ? 'Raise the inverter-side inductance or the switching frequency.' : null,
  });

  const ripplePeakV = s / (2 * w0 * design.dcLink.capacitanceF * vdc);
  const dcLinkRipplePeakToPeakV = 2 * ripplePeakV;
  const minimumDcLinkVoltageV = Math.SQRT2 * (v + w0 * lTotal * ratedCurrentA);
  const lowestDcLinkV = vdc - ripplePeakV;
  const dcLinkHeadroomV = lowestDcLinkV - minimumDcLinkVoltageV;
  checks.push({
    id: 'plant-dc-link-ripple',
    severity: 'info',
    message: `DC-link ripple at ${2 * f0} Hz is ${dcLinkRipplePeakToPeakV.toFixed(2)} V peak to peak at rated apparent power.`,
    value: dcLinkRipplePeakToPeakV, limit: null, unit: 'V',
  });
  const headroomSeverity = lowestDcLinkV < minimumDcLinkVoltageV ? 'error' : lowestDcLinkV < minimumDcLinkVoltageV * (1 + DC_LINK_MARGIN) ? 'warning' : 'info';
  checks.push({
    id: 'plant-dc-link-headroom',
    severity: headroomSeverity,
    message: `The modulator needs ${minimumDcLinkVoltageV.toFixed(1)} V at rated current; the DC link dips to ${lowestDcLinkV.toFixed(1)} V (headroom ${dcLinkHeadroomV.toFixed(1)} V).`,
    value: lowestDcLinkV, limit: minimumDcLinkVoltageV * (1 + DC_LINK_MARGIN), unit: 'V',
    remedy: headroomSeverity === 'info' ? null : 'Raise the DC-link voltage reference or the DC-link capacitance.',
  });

  let lclResonanceHz: number | null = null;
  let lclCapacitorReactiveFraction: number | null = null;
  if (design.filter.topology === 'LCL') {
    const { inverterInductanceH: l1, gridInductanceH: l2, capacitanceF: cf } = design.filter;
    lclResonanceHz = lclResonanceOf(l1, l2, cf);
    const placed = lclResonanceHz > 10 * f0 && lclResonanceHz < sampleRateHz / 2;
    checks.push({
      id: 'plant-lcl-resonance',
      severity: placed ? 'info' : 'warning',
      message: `LCL resonance at ${lclResonanceHz.toFixed(0)} Hz; recommended between ${10 * f0} Hz (10 × grid) and ${sampleRateHz / 2} Hz (half the sampling rate).`,
      value: lclResonanceHz, limit: sampleRateHz / 2, unit: 'Hz',
      remedy: placed ? null : 'Change the filter capacitor or the grid-side inductance to move the resonance.',
    });
    lclCapacitorReactiveFraction = (w0 * cf * v * v) / s;
    checks.push({
      id: 'plant-lcl-capacitor-reactive',
      severity: lclCapacitorReactiveFraction > LCL_CAPACITOR_REACTIVE_LIMIT ? 'warning' : 'info',
      message: `The filter capacitor draws ${(lclCapacitorReactiveFraction * 100).toFixed(2)} % of the rating as reactive power (limit 5 %).`,
      value: lclCapacitorReactiveFraction, limit: LCL_CAPACITOR_REACTIVE_LIMIT, unit: 'fraction',
      remedy: lclCapacitorReactiveFraction > LCL_CAPACITOR_REACTIVE_LIMIT ? 'Use a smaller filter capacitor.' : null,
    });
  }

  const h2 = sectionResponse(estimator, 2 * f0, samplePeriodS);
  const estimatorAttenuationDb = -20 * Math.log10(Math.hypot(h2.re, h2.im));
  const wc = 2 * Math.PI * design.reactiveFilter.cutoffHz;
  const estimatorSettlingTimeS = stepSettlingTimeS(estimator, samplePeriodS, Math.max(40 / wc, 0.01));
  checks.push({
    id: 'estimator-ripple-attenuation',
    severity: estimatorAttenuationDb < ESTIMATOR_ATTENUATION_LIMIT_DB ? 'warning' : 'info',
    message: `The reactive-current low-pass attenuates the ${2 * f0} Hz product term by ${estimatorAttenuationDb.toFixed(1)} dB; its step settles (2 %) in ${estimatorSettlingTimeS === null ? 'more than the simulated horizon' : `${(estimatorSettlingTimeS * 1000).toFixed(1)} ms`}.`,
    value: estimatorAttenuationDb, limit: ESTIMATOR_ATTENUATION_LIMIT_DB, unit: 'dB', blockId: 'reactive-lpf',
    remedy: estimatorAttenuationDb < ESTIMATOR_ATTENUATION_LIMIT_DB ? 'Lower the cutoff or use the second-order low-pass.' : null,
  });

  return {
    summary: {
      ratedCurrentA, ratedPeakCurrentA, totalInductanceH: lTotal, inductorDropFraction, rippleCurrentPeakToPeakA, rippleFractionOfPeak,
      dcLinkRipplePeakToPeakV, minimumDcLinkVoltageV, dcLinkHeadroomV, lclResonanceHz, lclCapacitorReactiveFraction,
      estimatorAttenuationDb, estimatorSettlingTimeS,
    },
    checks,
  };
}
