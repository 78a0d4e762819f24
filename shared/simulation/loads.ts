/**
 * Load models sized from power ratings.
 */
import type { LoadBranch, RectifierLoad, SeriesRcBranch, SeriesRlBranch } from './network';

/**
 * A series R-L or R-C branch that draws an apparent power at a power factor from a sinusoidal voltage.
 *
 * Method: |Z| = V^2 / S, R = |Z| pf, X = |Z| sqrt(1 - pf^2); L = X / w, C = 1 / (w X)
 * (phasor analysis; Nilsson & Riedel, "Electric Circuits", sinusoidal steady-state power, from memory).
 *
 * @param voltageRmsV - voltage across the branch, V rms.
 * @param frequencyHz - frequency, Hz.
 * @param apparentPowerVA - S, VA (> 0).
 * @param powerFactor - pf in (0, 1]; 1 gives a resistor-only branch of the R-L kind with no inductance.
 * @param kind - `lagging` (R-L) or `leading` (R-C).
 * @returns the branch.
 * @example
 * seriesLoadForPower(120, 60, 3300, 0.8, 'lagging'); // => { kind: 'series-rl', resistanceOhm: 3.4909, inductanceH: 6.945e-3 }
 */
export function seriesLoadForPower(voltageRmsV: number, frequencyHz: number, apparentPowerVA: number, powerFactor: number, kind: 'lagging' | 'leading'): LoadBranch {
  const z = (voltageRmsV * voltageRmsV) / apparentPowerVA;
  const r = z * powerFactor;
  const x = z * Math.sqrt(Math.max(0, 1 - powerFactor * powerFactor));
  const w = 2 * Math.PI * frequencyHz;
  if (kind === 'lagging') return { kind: 'series-rl', resistanceOhm: r, inductanceH: x / w } satisfies SeriesRlBranch;
  return { kind: 'series-rc', resistanceOhm: r, capacitanceF: 1 / (w * x) } satisfies SeriesRcBranch;
}

/**
 * Active and reactive power a branch draws from a sinusoidal voltage (phasor analysis, as above).
 *
 * @param branch - the branch.
 * @param voltageRmsV - V rms.
 * @param frequencyHz - Hz.
 * @returns P = V^2 R / |Z|^2 (W) and Q = V^2 X / |Z|^2 (var; positive inductive, negative capacitive).
 * @example
 * branchPower(seriesLoadForPower(120, 60, 3300, 0.8, 'lagging'), 120, 60); // => { activePowerW: 2640, reactivePowerVar: 1980 }
 */
export function branchPower(branch: LoadBranch, voltageRmsV: number, frequencyHz: number): { activePowerW: number; reactivePowerVar: number } {
  const w = 2 * Math.PI * frequencyHz;
  const x = branch.kind === 'series-rl' ? w * branch.inductanceH : -1 / (w * branch.capacitanceF);
  const z2 = branch.resistanceOhm * branch.resistanceOhm + x * x;
  const v2 = voltageRmsV * voltageRmsV;
  return { activePowerW: (v2 * branch.resistanceOhm) / z2, reactivePowerVar: (v2 * x) / z2 };
}

/** Sizing rules of the rectifier load (common practice, no source). */
export const RECTIFIER_SIZING = {
  /** DC voltage taken as 0.9 x the AC peak for the resistor (a capacitor-input rectifier under load). */
  dcVoltagePerPeak: 0.9,
  /** Input inductor: 3 % of the rectifier's own base impedance V^2 / P at the grid frequency. */
  inputImpedanceFraction: 0.03,
  /** Input resistance: 0.5 % of that base impedance. */
  inputResistanceFraction: 0.005,
  /** DC capacitor for about 5 % peak-to-peak ripple: C = P / (2 f Vdc^2 * 0.05) (charge per half cycle). */
  rippleFraction: 0.05,
} as const;

/**
 * A diode-rectifier load with a capacitor-input DC side drawing about `powerW` (see {@link RECTIFIER_SIZING}).
 *
 * @param voltageRmsV - AC voltage, V rms.
 * @param frequencyHz - grid frequency, Hz.
 * @param powerW - DC power at the nominal DC voltage, W (> 0).
 * @returns the rectifier.
 * @example
 * rectifierLoadForPower(120, 60, 500).loadResistanceOhm; // => (0.9 * 169.7)^2 / 500 = 46.65 ohm
 */
export function rectifierLoadForPower(voltageRmsV: number, frequencyHz: number, powerW: number): RectifierLoad {
  const vdc = RECTIFIER_SIZING.dcVoltagePerPeak * Math.SQRT2 * voltageRmsV;
  const zBase = (voltageRmsV * voltageRmsV) / powerW;
  return {
    inductanceH: (RECTIFIER_SIZING.inputImpedanceFraction * zBase) / (2 * Math.PI * frequencyHz),
    resistanceOhm: RECTIFIER_SIZING.inputResistanceFraction * zBase,
    capacitanceF: powerW / (2 * frequencyHz * vdc * vdc * RECTIFIER_SIZING.rippleFraction),
    loadResistanceOhm: (vdc * vdc) / powerW,
  };
}
