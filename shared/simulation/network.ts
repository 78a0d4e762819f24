/**
 * The power circuit at the point of connection, as linear state equations per switching mode.
 *
 * Circuit (SI, currents in A, voltages in V, ground = grid neutral):
 * - grid source v_s(t) behind R_g + L_g into the point of common coupling (PCC); L_g = 0 is a stiff
 *   grid (the PCC voltage is the source voltage);
 * - the converter: DC link C_dc with a loss resistance, full bridge with output voltage m v_dc
 *   (m in [-1, 1]: the averaged duty difference of the two legs, or the switch state -1, 0, +1),
 *   then an L filter (R in series) or an LCL filter (R in series with L1, C_f with R_d in series,
 *   L2 to the PCC), as in CONTRACT section 3;
 * - loads at the PCC: series R-L and series R-C branches, each closed or open, and an optional
 *   single-phase diode rectifier (input L_r, R_r; DC capacitor C_r with load resistor R_dc).
 *
 * For a fixed mode (which branches are closed, which rectifier diodes conduct) and a fixed m the
 * equations are linear: dx/dt = (A0 + m A1) x + B v_s. The bridge couples AC and DC sides
 * bilinearly (v_bridge = m v_dc, i_dc = m i1), which is why A depends on m; the power m v_dc i1
 * leaves the DC link and enters the filter, so the model conserves energy.
 *
 * The PCC voltage is algebraic: v_s on a stiff grid; with a resistive path (a closed R-C branch) it
 * follows from Kirchhoff's current law; when only inductive branches meet at the PCC it follows
 * from the derivative of that law (the inductive divider), and the branch currents then obey
 * sum(i) = 0, which the trapezoidal rule preserves exactly (it preserves linear invariants) and
 * {@link projectConsistent} restores after a branch current is reset.
 */
import type { FilterInput } from '../control';

/** Series impedance of the grid at the PCC; `inductanceH` 0 is a stiff grid. */
export interface GridImpedance {
  inductanceH: number;
  resistanceOhm: number;
}

/** A series R-L load branch between the PCC and neutral. */
export interface SeriesRlBranch {
  kind: 'series-rl';
  resistanceOhm: number;
  inductanceH: number;
}

/** A series R-C load branch between the PCC and neutral. */
export interface SeriesRcBranch {
  kind: 'series-rc';
  resistanceOhm: number;
  capacitanceF: number;
}

/** A linear load branch. */
export type LoadBranch = SeriesRlBranch | SeriesRcBranch;

/** Single-phase diode bridge with an input inductor and a DC capacitor feeding a resistor. */
export interface RectifierLoad {
  inductanceH: number;
  resistanceOhm: number;
  capacitanceF: number;
  loadResistanceOhm: number;
}

/** Everything the circuit needs; SI units. */
export interface PlantConfig {
  grid: GridImpedance;
  filter: FilterInput;
  dcLink: {
    capacitanceF: number;
    /** Resistance across the DC link standing for the converter's losses; null = lossless. */
    lossResistanceOhm: number | null;
  };
  loads: LoadBranch[];
  rectifier: RectifierLoad | null;
}

/** Which rectifier diodes conduct: none, the pair for positive input current, or the other pair. */
export type RectifierState = 'off' | 'positive' | 'negative';

/** Switching mode of the loads: which branches are closed and what the rectifier does. */
export interface NetworkMode {
  loadClosed: boolean[];
  rectifier: RectifierState;
}

/** Where each state sits in the state vector (-1 when absent). */
export interface NetworkLayout {
  /** Number of states. */
  n: number;
  /** Grid inductor current into the PCC (weak grid only). */
  gridCurrent: number;
  /** Inverter-side filter current (out of the bridge). */
  inverterCurrent: number;
  /** LCL grid-side inductor current into the PCC. */
  gridSideCurrent: number;
  /** LCL capacitor voltage (without the damping resistor's drop). */
  filterCapacitorVoltage: number;
  /** Per load branch: R-L current out of the PCC, or R-C capacitor voltage. */
  load: number[];
  /** Rectifier input current out of the PCC. */
  rectifierCurrent: number;
  /** Rectifier DC capacitor voltage. */
  rectifierVoltage: number;
  /** DC-link voltage. */
  dcVoltage: number;
}

/** Indices of the outputs {@link evaluateNetwork} writes. */
export const OUTPUT = {
  /** PCC voltage, V. */
  pccVoltage: 0,
  /** Grid current into the PCC, A. */
  gridCurrent: 1,
  /** Inverter-side filter current out of the bridge, A (the controlled current). */
  inverterCurrent: 2,
  /** Current the filter delivers into the PCC (L: the inverter current; LCL: the grid-side inductor current), A. */
  filterCurrent: 3,
  /** Total load current out of the PCC, A. */
  loadCurrent: 4,
  /** DC-link voltage, V. */
  dcVoltage: 5,
  /** LCL capacitor-branch current, A (0 for L). */
  capacitorCurrent: 6,
  /** Rectifier input current, A. */
  rectifierCurrent: 7,
} as const;

/** Number of fixed outputs; load branch k's current is output `OUTPUT_BASE_COUNT + k`. */
export const OUTPUT_BASE_COUNT = 8;

/**
 * The state layout of a plant.
 *
 * @param config - the plant.
 * @returns indices of every state; order: grid, filter, loads, rectifier, DC link.
 * @example
 * networkLayout(stiffLFilterPlant).n; // => 2 for an L filter, no loads, stiff grid (i1, v_dc)
 */
export function networkLayout(config: PlantConfig): NetworkLayout {
  let n = 0;
  const next = (): number => n++;
  const gridCurrent = config.grid.inductanceH > 0 ? next() : -1;
  const inverterCurrent = next();
  const lcl = config.filter.topology === 'LCL';
  const gridSideCurrent = lcl ? next() : -1;
  const filterCapacitorVoltage = lcl ? next() : -1;
  const load = config.loads.map(() => next());
  const rectifierCurrent = config.rectifier ? next() : -1;
  const rectifierVoltage = config.rectifier ? next() : -1;
  const dcVoltage = next();
  return { n, gridCurrent, inverterCurrent, gridSideCurrent, filterCapacitorVoltage, load, rectifierCurrent, rectifierVoltage, dcVoltage };
}

/**
 * A key naming a mode, for caching its matrices.
 *
 * @param mode - the mode.
 * @returns e.g. `10|off` (first branch closed, second open, rectifier off).
 * @example
 * modeKey({ loadClosed: [true, false], rectifier: 'off' }); // => '10|off'
 */
export function modeKey(mode: NetworkMode): string {
  return `${mode.loadClosed.map((c) => (c ? '1' : '0')).join('')}|${mode.rectifier}`;
}

/**
 * Whether the PCC is a node where only inductive branches meet (a weak grid with no closed R-C
 * branch): then the branch currents into the PCC must sum to zero.
 *
 * @param config - the plant.
 * @param mode - the mode.
 * @returns true for an inductive cut-set at the PCC.
 * @example
 * isInductiveCutSet(stiffPlant, mode); // => false (the source fixes the PCC voltage)
 */
export function isInductiveCutSet(config: PlantConfig, mode: NetworkMode): boolean {
  if (!(config.grid.inductanceH > 0)) return false;
  return !config.loads.some((b, k) => b.kind === 'series-rc' && mode.loadClosed[k]);
}

/**
 * Evaluates the circuit: state derivatives and outputs at one instant (Kirchhoff's laws).
 *
 * @param config - the plant.
 * @param layout - its layout.
 * @param mode - switching mode of the loads.
 * @param x - state (A, V), length `layout.n`.
 * @param sourceVoltageV - grid source voltage v_s, V.
 * @param bridgeRatio - m: bridge output voltage over DC-link voltage (-1 to 1).
 * @param dx - derivative output (A/s, V/s), length n, or null.
 * @param y - outputs (see {@link OUTPUT}), length `OUTPUT_BASE_COUNT + loads`, or null.
 * @example
 * evaluateNetwork(config, layout, mode, x, 169.7, 0.5, dx, null); // fills dx
 */
export function evaluateNetwork(
  config: PlantConfig,
  layout: NetworkLayout,
  mode: NetworkMode,
  x: Float64Array,
  sourceVoltageV: number,
  bridgeRatio: number,
  dx: Float64Array | null,
  y: Float64Array | null,
): void {
  const f = config.filter;
  const lcl = f.topology === 'LCL';
  const i1 = x[layout.inverterCurrent];
  const vdc = x[layout.dcVoltage];
  const vBridge = bridgeRatio * vdc;
  const i2 = lcl ? x[layout.gridSideCurrent] : 0;
  const vcf = lcl ? x[layout.filterCapacitorVoltage] : 0;
  const capacitorCurrent = lcl ? i1 - i2 : 0;
  // LCL middle node: capacitor voltage plus the damping resistor's drop.
  const vNode = lcl ? vcf + f.dampingResistanceOhm * capacitorCurrent : 0;
  const rect = config.rectifier;
  const ir = rect ? x[layout.rectifierCurrent] : 0;
  const vr = rect ? x[layout.rectifierVoltage] : 0;
  const rectOn = rect !== null && mode.rectifier !== 'off';
  const rectBack = mode.rectifier === 'positive' ? vr : mode.rectifier === 'negative' ? -vr : 0;

  let vp: number;
  const stiff = !(config.grid.inductanceH > 0);
  if (stiff) {
    vp = sourceVoltageV;
  } else {
    // Inductive branches into the PCC: L dj/dt = drive - vp, with j the current into the PCC.
    const lg = config.grid.inductanceH;
    const ig = x[layout.gridCurrent];
    let invL = 1 / lg;
    let driveOverL = (sourceVoltageV - config.grid.resistanceOhm * ig) / lg;
    let sumJ = ig;
    if (lcl) {
      invL += 1 / f.gridInductanceH;
      driveOverL += vNode / f.gridInductanceH;
      sumJ += i2;
    } else {
      invL += 1 / f.inductanceH;
      driveOverL += (vBridge - f.resistanceOhm * i1) / f.inductanceH;
      sumJ += i1;
    }
    let conductance = 0;
    let conductanceVoltage = 0;
    config.loads.forEach((b, k) => {
      if (!mode.loadClosed[k]) return;
      const s = x[layout.load[k]];
      if (b.kind === 'series-rl') {
        invL += 1 / b.inductanceH;
        driveOverL += (b.resistanceOhm * s) / b.inductanceH; // j = -i_load: drive = R i_load
        sumJ -= s;
      } else {
        conductance += 1 / b.resistanceOhm;
        conductanceVoltage += s / b.resistanceOhm;
      }
    });
    if (rect && rectOn) {
      invL += 1 / rect.inductanceH;
      driveOverL += (rectBack + rect.resistanceOhm * ir) / rect.inductanceH;
      sumJ -= ir;
    }
    // Resistive path: KCL sum(j) + sum((v_c - vp)/R) = 0. Otherwise the inductive divider.
    vp = conductance > 0 ? (sumJ + conductanceVoltage) / conductance : driveOverL / invL;
  }

  let loadCurrent = 0;
  config.loads.forEach((b, k) => {
    if (!mode.loadClosed[k]) {
      if (y) y[OUTPUT_BASE_COUNT + k] = 0;
      return;
    }
    const s = x[layout.load[k]];
    const current = b.kind === 'series-rl' ? s : (vp - s) / b.resistanceOhm;
    loadCurrent += current;
    if (y) y[OUTPUT_BASE_COUNT + k] = current;
  });
  if (rectOn) loadCurrent += ir;
  const filterCurrent = lcl ? i2 : i1;

  if (dx) {
    if (!stiff) dx[layout.gridCurrent] = (sourceVoltageV - config.grid.resistanceOhm * x[layout.gridCurrent] - vp) / config.grid.inductanceH;
    if (lcl) {
      dx[layout.inverterCurrent] = (vBridge - f.resistanceOhm * i1 - vNode) / f.inverterInductanceH;
      dx[layout.gridSideCurrent] = (vNode - vp) / f.gridInductanceH;
      dx[layout.filterCapacitorVoltage] = capacitorCurrent / f.capacitanceF;
    } else {
      dx[layout.inverterCurrent] = (vBridge - f.resistanceOhm * i1 - vp) / f.inductanceH;
    }
    config.loads.forEach((b, k) => {
      const idx = layout.load[k];
      if (!mode.loadClosed[k]) { dx[idx] = 0; return; }
      dx[idx] = b.kind === 'series-rl'
        ? (vp - b.resistanceOhm * x[idx]) / b.inductanceH
        : (vp - x[idx]) / (b.resistanceOhm * b.capacitanceF);
    });
    if (rect) {
      const dcDrain = vr / rect.loadResistanceOhm;
      dx[layout.rectifierCurrent] = rectOn ? (vp - rect.resistanceOhm * ir - rectBack) / rect.inductanceH : 0;
      const charge = mode.rectifier === 'positive' ? ir : mode.rectifier === 'negative' ? -ir : 0;
      dx[layout.rectifierVoltage] = (charge - dcDrain) / rect.capacitanceF;
    }
    const loss = config.dcLink.lossResistanceOhm === null ? 0 : vdc / config.dcLink.lossResistanceOhm;
    dx[layout.dcVoltage] = (-bridgeRatio * i1 - loss) / config.dcLink.capacitanceF;
  }
  if (y) {
    y[OUTPUT.pccVoltage] = vp;
    y[OUTPUT.gridCurrent] = stiff ? loadCurrent - filterCurrent : x[layout.gridCurrent];
    y[OUTPUT.inverterCurrent] = i1;
    y[OUTPUT.filterCurrent] = filterCurrent;
    y[OUTPUT.loadCurrent] = loadCurrent;
    y[OUTPUT.dcVoltage] = vdc;
    y[OUTPUT.capacitorCurrent] = capacitorCurrent;
    y[OUTPUT.rectifierCurrent] = rectOn ? ir : 0;
  }
}

/**
 * Restores the constraints a mode imposes after a branch current was reset: open R-L branches and
 * a non-conducting rectifier carry no current, and at an inductive cut-set the grid current is
 * set so the currents into the PCC sum to zero.
 *
 * @param config - the plant.
 * @param layout - its layout.
 * @param mode - the mode now in force.
 * @param x - state, modified in place.
 * @example
 * projectConsistent(config, layout, mode, x); // x[layout.gridCurrent] = -(sum of the other currents into the PCC)
 */
export function projectConsistent(config: PlantConfig, layout: NetworkLayout, mode: NetworkMode, x: Float64Array): void {
  config.loads.forEach((b, k) => {
    if (b.kind === 'series-rl' && !mode.loadClosed[k]) x[layout.load[k]] = 0;
  });
  if (config.rectifier && mode.rectifier === 'off') x[layout.rectifierCurrent] = 0;
  if (!isInductiveCutSet(config, mode)) return;
  let out = 0;
  config.loads.forEach((b, k) => {
    if (b.kind === 'series-rl' && mode.loadClosed[k]) out += x[layout.load[k]];
  });
  if (config.rectifier && mode.rectifier !== 'off') out += x[layout.rectifierCurrent];
  const filterIn = config.filter.topology === 'LCL' ? x[layout.gridSideCurrent] : x[layout.inverterCurrent];
  x[layout.gridCurrent] = out - filterIn;
}

/** Linear matrices of one mode: dx/dt = (a0 + m a1) x + b v_s; outputs y = (c0 + m c1) x + d v_s. Row-major. */
export interface ModeMatrices {
  a0: Float64Array;
  a1: Float64Array;
  b: Float64Array;
  c0: Float64Array;
  c1: Float64Array;
  d: Float64Array;
}

/**
 * The matrices of a mode, by probing the (linear) circuit equations with unit states and inputs:
 * column j of A0 is the derivative at x = e_j, m = 0, v_s = 0; A0 + A1 at m = 1; B at x = 0, v_s = 1.
 *
 * @param config - the plant.
 * @param layout - its layout.
 * @param mode - the mode.
 * @returns the matrices (n x n, n, outputs x n, outputs).
 * @example
 * modeMatrices(config, layout, mode).a0; // n*n entries, row-major
 */
export function modeMatrices(config: PlantConfig, layout: NetworkLayout, mode: NetworkMode): ModeMatrices {
  const n = layout.n;
  const p = OUTPUT_BASE_COUNT + config.loads.length;
  const a0 = new Float64Array(n * n);
  const a1 = new Float64Array(n * n);
  const c0 = new Float64Array(p * n);
  const c1 = new Float64Array(p * n);
  const x = new Float64Array(n);
  const dx = new Float64Array(n);
  const y = new Float64Array(p);
  for (let j = 0; j < n; j++) {
    x.fill(0);
    x[j] = 1;
    evaluateNetwork(config, layout, mode, x, 0, 0, dx, y);
    for (let i = 0; i < n; i++) a0[i * n + j] = dx[i];
    for (let i = 0; i < p; i++) c0[i * n + j] = y[i];
    evaluateNetwork(config, layout, mode, x, 0, 1, dx, y);
    for (let i = 0; i < n; i++) a1[i * n + j] = dx[i] - a0[i * n + j];
    for (let i = 0; i < p; i++) c1[i * n + j] = y[i] - c0[i * n + j];
  }
  x.fill(0);
  const b = new Float64Array(n);
  const d = new Float64Array(p);
  evaluateNetwork(config, layout, mode, x, 1, 0, b, d);
  return { a0, a1, b, c0, c1, d };
}

/**
 * Energy stored on the converter side: (1/2) L i^2 of the filter inductors, (1/2) C v^2 of the filter
 * capacitor and the DC link.
 *
 * @param config - the plant.
 * @param layout - its layout.
 * @param x - state.
 * @returns the energy, J.
 * @example
 * converterStoredEnergyJ(config, layout, x); // => 44 for 2.2 mF at 200 V and no current
 */
export function converterStoredEnergyJ(config: PlantConfig, layout: NetworkLayout, x: Float64Array): number {
  const f = config.filter;
  const vdc = x[layout.dcVoltage];
  let e = 0.5 * config.dcLink.capacitanceF * vdc * vdc;
  const i1 = x[layout.inverterCurrent];
  if (f.topology === 'LCL') {
    const i2 = x[layout.gridSideCurrent];
    const vc = x[layout.filterCapacitorVoltage];
    e += 0.5 * (f.inverterInductanceH * i1 * i1 + f.gridInductanceH * i2 * i2 + f.capacitanceF * vc * vc);
  } else {
    e += 0.5 * f.inductanceH * i1 * i1;
  }
  return e;
}

/**
 * Power dissipated on the converter side at one instant: filter series resistance, LCL damping
 * resistor and the DC-link loss resistance, W.
 *
 * @param config - the plant.
 * @param layout - its layout.
 * @param x - state.
 * @returns R i1^2 + R_d i_c^2 + v_dc^2 / R_loss, W.
 * @example
 * converterLossW(config, layout, x); // => 27 for 30 A through 0.03 ohm, lossless DC link
 */
export function converterLossW(config: PlantConfig, layout: NetworkLayout, x: Float64Array): number {
  const f = config.filter;
  const i1 = x[layout.inverterCurrent];
  const vdc = x[layout.dcVoltage];
  let p = f.resistanceOhm * i1 * i1;
  if (f.topology === 'LCL') {
    const ic = i1 - x[layout.gridSideCurrent];
    p += f.dampingResistanceOhm * ic * ic;
  }
  if (config.dcLink.lossResistanceOhm !== null) p += (vdc * vdc) / config.dcLink.lossResistanceOhm;
  return p;
}
