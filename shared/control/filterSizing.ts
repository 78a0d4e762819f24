/**
 * Filter sizing: starting values of the output filter and DC link from the rating, by the
 * published rules the plant checks apply (DESIGN pipeline step 1). The results are starting
 * points for the engineer, not a design: the analysis then checks the loops they give.
 */
import { ControlError } from './errors';

/** Inductor drop at rated current the L sizing aims for, fraction of grid voltage (common practice, no source). */
export const SIZING_INDUCTOR_DROP = 0.05;
/** LCL capacitor reactive power at rated voltage, fraction of the rating (Liserre, Blaabjerg & Hansen, IEEE TIA 41(5), 2005: at most 5 %). */
export const SIZING_CAPACITOR_REACTIVE = 0.05;
/** LCL resonance window: above this multiple of grid frequency (Liserre, Blaabjerg & Hansen 2005). */
export const LCL_RESONANCE_MIN_GRID_MULTIPLE = 10;
/** LCL damping resistor as a fraction of the capacitor's impedance at resonance (Liserre, Blaabjerg & Hansen 2005, from memory). */
export const LCL_DAMPING_FRACTION = 1 / 3;

/** The rating a sizing rule starts from. */
export interface SizingRating {
  /** Grid voltage, V rms (> 0). */
  voltageRmsV: number;
  /** Grid frequency, Hz (> 0). */
  frequencyHz: number;
  /** Rated apparent power, VA (> 0). */
  apparentPowerVA: number;
}

function checkRating(r: SizingRating): void {
  for (const [name, v] of Object.entries(r)) {
    if (!(v > 0) || !Number.isFinite(v)) throw new ControlError('invalid-argument', `${name} must be a positive finite number`);
  }
}

/**
 * Base impedance of the rating.
 *
 * Method: `Zb = V^2 / S` (per-unit base of a single-phase converter; Liserre, Blaabjerg & Hansen 2005).
 * @param rating - voltage (V rms), frequency (Hz), apparent power (VA).
 * @returns Zb in ohm.
 * @example
 * baseImpedanceOhm({ voltageRmsV: 240, frequencyHz: 60, apparentPowerVA: 5000 }); // => 11.52
 */
export function baseImpedanceOhm(rating: SizingRating): number {
  checkRating(rating);
  return (rating.voltageRmsV * rating.voltageRmsV) / rating.apparentPowerVA;
}

/**
 * Inductance whose drop at rated current is a given fraction of the grid voltage.
 *
 * Method: `w0 L I = x V` with `I = S / V`, so `L = x V^2 / (w0 S) = x Zb / w0` (the 5 % inductor-drop
 * rule of thumb, common practice; the same drop the plant check `plant-inductor-drop` reports).
 * @param rating - voltage (V rms), frequency (Hz), apparent power (VA).
 * @param dropFraction - x, fraction of grid voltage (0 < x < 1); the rule uses 0.05.
 * @returns L in H.
 * @example
 * inductanceForDropH({ voltageRmsV: 120, frequencyHz: 60, apparentPowerVA: 3300 }, 0.05); // => 5.787e-4
 */
export function inductanceForDropH(rating: SizingRating, dropFraction: number): number {
  if (!(dropFraction > 0 && dropFraction < 1)) throw new ControlError('invalid-argument', 'dropFraction must lie in (0, 1)');
  return (dropFraction * baseImpedanceOhm(rating)) / (2 * Math.PI * rating.frequencyHz);
}

/**
 * Filter capacitance that draws a given fraction of the rating as reactive power at grid voltage.
 *
 * Method: `Q = w0 Cf V^2 = x S`, so `Cf = x / (w0 Zb)` (Liserre, Blaabjerg & Hansen, IEEE TIA 41(5),
 * 2005: x at most 5 %; the same fraction the plant check `plant-lcl-capacitor-reactive` reports).
 * @param rating - voltage (V rms), frequency (Hz), apparent power (VA).
 * @param reactiveFraction - x, fraction of the rating (0 < x < 1).
 * @returns Cf in F.
 * @example
 * capacitanceForReactiveFractionF({ voltageRmsV: 240, frequencyHz: 60, apparentPowerVA: 5000 }, 0.05); // => 1.1515e-5
 */
export function capacitanceForReactiveFractionF(rating: SizingRating, reactiveFraction: number): number {
  if (!(reactiveFraction > 0 && reactiveFraction < 1)) throw new ControlError('invalid-argument', 'reactiveFraction must lie in (0, 1)');
  return reactiveFraction / (2 * Math.PI * rating.frequencyHz * baseImpedanceOhm(rating));
}

/**
 * Resonance frequency of an LCL filter.
 *
 * Method: `f_res = sqrt((L1 + L2) / (L1 L2 Cf)) / (2 pi)` (Liserre, Blaabjerg & Hansen, IEEE TIA 41(5), 2005).
 * @param inverterInductanceH - L1, H (> 0).
 * @param gridInductanceH - L2, H (> 0).
 * @param capacitanceF - Cf, F (> 0).
 * @returns f_res in Hz.
 * @example
 * lclResonanceHz(1e-3, 0.5e-3, 8.2e-6); // => 3044.7
 */
export function lclResonanceHz(inverterInductanceH: number, gridInductanceH: number, capacitanceF: number): number {
  return Math.sqrt((inverterInductanceH + gridInductanceH) / (inverterInductanceH * gridInductanceH * capacitanceF)) / (2 * Math.PI);
}

/** A starting LCL filter and the figures of the rules it follows. */
export interface StartingLcl {
  inverterInductanceH: number;
  gridInductanceH: number;
  capacitanceF: number;
  dampingResistanceOhm: number;
  /** Resonance of the chosen values, Hz. */
  resonanceHz: number;
  /** The window the resonance must lie in: 10 × grid frequency and half the sampling rate, Hz. */
  resonanceWindowHz: [number, number];
  /** Capacitor reactive power, fraction of the rating. */
  capacitorReactiveFraction: number;
  /** Drop of L1 + L2 at rated current, fraction of grid voltage. */
  inductorDropFraction: number;
}

/**
 * A starting LCL filter from the published rules (Liserre, Blaabjerg & Hansen, "Design and control
 * of an LCL-filter-based three-phase active rectifier", IEEE TIA 41(5), 2005).
 *
 * Method: total inductance `L1 + L2` from the 5 % drop rule (`inductanceForDropH`); `Cf` at 5 % reactive
 * power (`capacitanceForReactiveFractionF`); the split `L1 = a (L1 + L2)`, `a >= 1/2` (the larger
 * inductor on the inverter side, which carries the switching ripple), chosen so the resonance
 * `sqrt((L1 + L2)/(L1 L2 Cf)) / (2 pi)` lands at the geometric mean of its window `(10 f0, fs/2)`:
 * `a (1 - a) = 1 / ((L1 + L2) Cf (2 pi f_t)^2)`; when even the equal split (the lowest resonance,
 * `1 / (pi sqrt((L1 + L2) Cf))`) lies above that target, the equal split is kept. Passive damping
 * `Rd = 1 / (3 w_res Cf)`, a third of the capacitor's impedance at resonance (same source, from memory).
 * @param rating - voltage (V rms), frequency (Hz), apparent power (VA).
 * @param sampleRateHz - controller sampling rate fs, Hz (> 20 × grid frequency).
 * @returns the values, or null when no split of these L and Cf places the resonance below fs/2.
 * @example
 * startingLcl({ voltageRmsV: 240, frequencyHz: 60, apparentPowerVA: 5000 }, 32000)?.resonanceHz; // => 3098.4 (sqrt(600 * 16000))
 */
export function startingLcl(rating: SizingRating, sampleRateHz: number): StartingLcl | null {
  checkRating(rating);
  const f0 = rating.frequencyHz;
  if (!(sampleRateHz > 2 * LCL_RESONANCE_MIN_GRID_MULTIPLE * f0) || !Number.isFinite(sampleRateHz)) {
    throw new ControlError('invalid-argument', `sampleRateHz must exceed ${2 * LCL_RESONANCE_MIN_GRID_MULTIPLE} x the grid frequency`);
  }
  const totalH = inductanceForDropH(rating, SIZING_INDUCTOR_DROP);
  const capacitanceF = capacitanceForReactiveFractionF(rating, SIZING_CAPACITOR_REACTIVE);
  const window: [number, number] = [LCL_RESONANCE_MIN_GRID_MULTIPLE * f0, sampleRateHz / 2];
  const targetHz = Math.sqrt(window[0] * window[1]);
  const k = 1 / (totalH * capacitanceF * (2 * Math.PI * targetHz) ** 2);
  const a = k <= 0.25 ? (1 + Math.sqrt(1 - 4 * k)) / 2 : 0.5;
  const inverterInductanceH = a * totalH;
  const gridInductanceH = totalH - inverterInductanceH;
  const resonanceHz = lclResonanceHz(inverterInductanceH, gridInductanceH, capacitanceF);
  if (!(resonanceHz < window[1])) return null;
  return {
    inverterInductanceH,
    gridInductanceH,
    capacitanceF,
    dampingResistanceOhm: LCL_DAMPING_FRACTION / (2 * Math.PI * resonanceHz * capacitanceF),
    resonanceHz,
    resonanceWindowHz: window,
    capacitorReactiveFraction: SIZING_CAPACITOR_REACTIVE,
    inductorDropFraction: SIZING_INDUCTOR_DROP,
  };
}

/**
 * DC-link capacitance for a given peak ripple at twice grid frequency.
 *
 * Method: the 2w0 power ripple of a single-phase converter equals S, so
 * `C = S / (2 w0 Vdc dV_peak)` (Kjaer, Pedersen & Blaabjerg, "A review of single-phase grid-connected
 * inverters for photovoltaic modules", IEEE TIA 41(5), 2005).
 * @param rating - voltage (V rms), frequency (Hz), apparent power (VA).
 * @param voltageRefV - DC-link voltage Vdc, V (> 0).
 * @param ripplePeakV - allowed peak ripple dV, V (> 0).
 * @returns C in F.
 * @example
 * dcLinkCapacitanceForRippleF({ voltageRmsV: 120, frequencyHz: 60, apparentPowerVA: 3300 }, 200, 10); // => 2.188e-3
 */
export function dcLinkCapacitanceForRippleF(rating: SizingRating, voltageRefV: number, ripplePeakV: number): number {
  checkRating(rating);
  if (!(voltageRefV > 0) || !(ripplePeakV > 0)) throw new ControlError('invalid-argument', 'voltageRefV and ripplePeakV must be positive');
  return rating.apparentPowerVA / (2 * (2 * Math.PI * rating.frequencyHz) * voltageRefV * ripplePeakV);
}
