/**
 * A consistent starting state: the sinusoidal steady state of the circuit at the grid frequency with
 * the converter idle (no inverter current, the bridge producing exactly the voltage that keeps it
 * at zero) and the DC link charged to its reference, matching a controller just reset (PLL at angle
 * 0 with the source, estimator and PIs at zero). The warm-up then brings the loop to its operating
 * point before anything is recorded.
 *
 * Phasors: x(t) = Re(X e^{j w t}); the state equations give (j w I - A) X = B_s V_s + B_c V_c with
 * V_s = -j sqrt(2) V (v_s = sqrt(2) V sin w t), solved as a real system of twice the size
 * (Nilsson & Riedel, "Electric Circuits", sinusoidal steady-state analysis, from memory).
 */
import { createLuFactors, luFactor, luSolve } from './linearAlgebra';
import { RECTIFIER_SIZING } from './loads';
import { modeMatrices, type NetworkLayout, type NetworkMode, type PlantConfig } from './network';

/** The starting state and the bridge voltage phasor that holds it. */
export interface OperatingPoint {
  /** Plant state at t = 0. */
  state: Float64Array;
  /** Bridge voltage phasor V_c (v_c(t) = Re(V_c e^{j w t})), V. */
  bridgeVoltage: { re: number; im: number };
}

// Solves (j w I - A) X = rhs for complex X, A real n x n restricted to `rows` (other states fixed at 0).
function solvePhasor(a: Float64Array, n: number, rows: number[], omega: number, rhsRe: Float64Array, rhsIm: Float64Array): { re: Float64Array; im: Float64Array } {
  const m = rows.length;
  const size = 2 * m;
  const big = new Float64Array(size * size);
  // [ -A  -wI ] [Xr]   [Br]
  // [ wI  -A  ] [Xi] = [Bi]
  for (let p = 0; p < m; p++) {
    for (let q = 0; q < m; q++) {
      const v = -a[rows[p] * n + rows[q]];
      big[p * size + q] = v;
      big[(p + m) * size + (q + m)] = v;
    }
    big[p * size + (p + m)] = -omega;
    big[(p + m) * size + p] = omega;
  }
  const b = new Float64Array(size);
  for (let p = 0; p < m; p++) { b[p] = rhsRe[rows[p]]; b[p + m] = rhsIm[rows[p]]; }
  const sol = luSolve(luFactor(big, createLuFactors(size)), b, new Float64Array(size));
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  for (let p = 0; p < m; p++) { re[rows[p]] = sol[p]; im[rows[p]] = sol[p + m]; }
  return { re, im };
}

/**
 * The idle steady state of the plant at t = 0 (source angle 0).
 *
 * @param config - the plant.
 * @param layout - its layout.
 * @param mode - the load mode at the start (the rectifier starts off, its capacitor charged).
 * @param voltageRmsV - source voltage, V rms.
 * @param frequencyHz - source frequency, Hz.
 * @param dcVoltageV - DC-link voltage, V.
 * @returns the state and the bridge voltage phasor.
 * @example
 * idleOperatingPoint(config, layout, mode, 120, 60, 200).state[layout.inverterCurrent]; // => 0
 */
export function idleOperatingPoint(config: PlantConfig, layout: NetworkLayout, mode: NetworkMode, voltageRmsV: number, frequencyHz: number, dcVoltageV: number): OperatingPoint {
  const n = layout.n;
  const omega = 2 * Math.PI * frequencyHz;
  const matrices = modeMatrices(config, layout, { loadClosed: mode.loadClosed, rectifier: 'off' });
  const excluded = new Set([layout.dcVoltage, layout.rectifierCurrent, layout.rectifierVoltage]);
  const rows: number[] = [];
  for (let i = 0; i < n; i++) if (!excluded.has(i)) rows.push(i);
  // B_c: how the bridge voltage m v_dc enters each row (column v_dc of A1).
  const bc = new Float64Array(n);
  for (let i = 0; i < n; i++) bc[i] = matrices.a1[i * n + layout.dcVoltage];
  const peak = Math.SQRT2 * voltageRmsV;
  const zero = new Float64Array(n);
  const bsIm = new Float64Array(n);
  for (let i = 0; i < n; i++) bsIm[i] = -peak * matrices.b[i];
  const fromSource = solvePhasor(matrices.a0, n, rows, omega, zero, bsIm);
  const fromBridge = solvePhasor(matrices.a0, n, rows, omega, bc, zero);
  // V_c such that the inverter current phasor is zero.
  const k = layout.inverterCurrent;
  const sr = fromSource.re[k], si = fromSource.im[k], br = fromBridge.re[k], bi = fromBridge.im[k];
  const den = br * br + bi * bi;
  const vcRe = -(sr * br + si * bi) / den;
  const vcIm = -(si * br - sr * bi) / den;
  const state = new Float64Array(n);
  for (const i of rows) state[i] = fromSource.re[i] + (vcRe * fromBridge.re[i] - vcIm * fromBridge.im[i]);
  state[k] = 0;
  state[layout.dcVoltage] = dcVoltageV;
  if (config.rectifier) state[layout.rectifierVoltage] = RECTIFIER_SIZING.dcVoltagePerPeak * peak;
  return { state, bridgeVoltage: { re: vcRe, im: vcIm } };
}
