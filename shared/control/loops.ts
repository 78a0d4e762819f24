/**
 * The three sampled loops of a design (CONTRACT section 3): current (parallel PR sections, a
 * computation delay of d samples and the zero-order-hold filter admittance), DC-link voltage (PI
 * on Kv Ts/(z - 1)) and PLL (PI on Ts/(z - 1)); their margins, closed-loop poles, open-loop
 * frequency responses, pole-zero maps and step responses.
 *
 * Closed-loop poles are eigenvalues of a state-space realization in which the controller stays a
 * parallel sum of second-order sections: expanding a sum of resonators into one high-order
 * polynomial gives spurious roots (see the tests).
 */
import { ControlError } from './errors';
import { loopMargins, type FrequencyFocus } from './margins';
import { roots, trimLeadingZeros, type Complex } from './polynomial';
import { eigenvalues, zohStateSpace, type Matrix, type StateSpace } from './stateSpace';
import { simulateLoop } from './timeResponse';
import { ssToTf } from './transferFunction';
import { logspace, unwrapDeg } from './frequencyResponse';
import type { AnalysisOptions, FilterInput, FrequencyResponseData, LoopId, LoopResult, TimeResponseData } from './types';

/** One second-order section in powers of z^-1: (b0 + b1 z^-1 + b2 z^-2)/(1 + a1 z^-1 + a2 z^-2); 3 entries each, a[0] = 1. */
export interface SectionCoefficients {
  b: readonly number[];
  a: readonly number[];
}

/** Everything {@link analyzeLoops} needs; SI units. */
export interface LoopInputs {
  /** Sampling period Ts in s. */
  samplePeriodS: number;
  /** Computation delay d of the current loop in samples (integer >= 0). */
  computationDelaySamples: number;
  /** L: 1/(L s + R); LCL: inverter-side current admittance of CONTRACT section 3. */
  filter: FilterInput;
  /** Parallel sections: C_pr(z) = sum of sections (proportional + resonators), input A error, output V. */
  currentController: readonly SectionCoefficients[];
  /** DC-link PI (V error in, A current-amplitude out); plant Kv Ts/(z - 1). */
  voltageController: SectionCoefficients;
  /** Kv in V/(A s). */
  voltagePlantGain: number;
  /** PLL PI (per-unit q error, i.e. rad of phase error, in; rad/s out); plant Ts/(z - 1). */
  pllController: SectionCoefficients;
}

/** Pole-zero map of one open loop in the z plane, as [re, im]. */
export interface PoleZeroMap {
  poles: [number, number][];
  zeros: [number, number][];
}

/** Result of {@link analyzeLoops}. */
export interface LoopAnalysis {
  /** ids 'current', 'voltage', 'pll' in that order. */
  loops: LoopResult[];
  /** null when options.sweepPoints = 0. */
  openLoop: Record<LoopId, FrequencyResponseData> | null;
  /** null when options.sweepPoints = 0. */
  poleZero: Record<LoopId, PoleZeroMap> | null;
  /** null when options.responseSamples = 0. */
  time: Record<'current-step' | 'pll-phase-step' | 'dc-link-load-step', TimeResponseData> | null;
}

/** A sampled SISO loop: controller sections, delay, discrete plant (D = 0). */
export interface SampledLoop {
  sections: SectionCoefficients[];
  delaySamples: number;
  plant: StateSpace;
}

function fail(message: string): never {
  throw new ControlError('invalid-argument', message);
}

function checkSection(s: SectionCoefficients, path: string): SectionCoefficients {
  if (!s || !Array.isArray(s.b) || !Array.isArray(s.a) || s.b.length > 3 || s.a.length > 3 || s.a.length === 0) fail(`${path}: b and a must hold at most 3 coefficients`);
  const b = [0, 1, 2].map((i) => s.b[i] ?? 0);
  const a = [0, 1, 2].map((i) => s.a[i] ?? 0);
  if ([...b, ...a].some((v) => !Number.isFinite(v))) fail(`${path}: coefficients must be finite`);
  if (a[0] !== 1) fail(`${path}: a[0] must be 1`);
  return { b, a };
}

// Number of states a section needs (0 pure gain, 1 first order, 2 second order).
function sectionOrder(s: SectionCoefficients): number {
  if (s.a[2] !== 0 || s.b[2] !== 0) return 2;
  if (s.a[1] !== 0 || s.b[1] !== 0) return 1;
  return 0;
}

/**
 * Continuous state-space model of the filter's current-from-voltage admittance.
 *
 * L: x = i, L di/dt = v - R i. LCL (grid side shorted, Rd in series with Cf, R in series with L1):
 * x = [i1, i2, vc], L1 di1/dt = v - R i1 - vn, L2 di2/dt = vn, Cf dvc/dt = i1 - i2 with the
 * node voltage vn = vc + Rd (i1 - i2); output i1 (Kirchhoff's laws; CONTRACT section 3).
 * @param filter - the filter (H, Ohm, F).
 * @returns { a, b, c, d: 0 }, input V, output A, continuous.
 * @throws ControlError `invalid-argument` for non-positive inductances/capacitance or negative resistances.
 * @example
 * filterAdmittanceStateSpace({ topology: 'L', inductanceH: 1e-3, resistanceOhm: 0.1 }).a; // => [[-100]]
 */
export function filterAdmittanceStateSpace(filter: FilterInput): StateSpace {
  const pos = (v: number, name: string): number => (v > 0 && Number.isFinite(v) ? v : fail(`filter.${name} must be a finite number > 0`));
  const nonneg = (v: number, name: string): number => (v >= 0 && Number.isFinite(v) ? v : fail(`filter.${name} must be a finite number >= 0`));
  if (filter.topology === 'L') {
    const L = pos(filter.inductanceH, 'inductanceH');
    const R = nonneg(filter.resistanceOhm, 'resistanceOhm');
    return { a: [[-R / L]], b: [1 / L], c: [1], d: 0, timebase: { kind: 'continuous' } };
  }
  const L1 = pos(filter.inverterInductanceH, 'inverterInductanceH');
  const L2 = pos(filter.gridInductanceH, 'gridInductanceH');
  const Cf = pos(filter.capacitanceF, 'capacitanceF');
  const Rd = nonneg(filter.dampingResistanceOhm, 'dampingResistanceOhm');
  const R = nonneg(filter.resistanceOhm, 'resistanceOhm');
  return {
    a: [
      [-(R + Rd) / L1, Rd / L1, -1 / L1],
      [Rd / L2, -Rd / L2, 1 / L2],
      [1 / Cf, -1 / Cf, 0],
    ],
    b: [1 / L1, 0, 0],
    c: [1, 0, 0],
    d: 0,
    timebase: { kind: 'continuous' },
  };
}

/**
 * The three sampled loops of CONTRACT section 3 as {@link SampledLoop}s.
 * @param inputs - validated loop inputs.
 * @returns current (ZOH plant, delay d), voltage (Kv Ts/(z - 1)), pll (Ts/(z - 1)).
 * @throws ControlError `invalid-argument` naming the bad field.
 * @example
 * buildLoops({ ...inputs, samplePeriodS: 1e-4, voltagePlantGain: 200 }).voltage.plant.b; // => [0.02]
 */
export function buildLoops(inputs: LoopInputs): Record<LoopId, SampledLoop> {
  const Ts = inputs.samplePeriodS;
  if (!(Ts > 0) || !Number.isFinite(Ts)) fail('samplePeriodS must be a finite number > 0');
  const d = inputs.computationDelaySamples;
  if (!Number.isInteger(d) || d < 0 || d > 16) fail('computationDelaySamples must be an integer from 0 to 16');
  if (!Array.isArray(inputs.currentController) || inputs.currentController.length === 0) fail('currentController must hold at least one section');
  const Kv = inputs.voltagePlantGain;
  if (!(Kv > 0) || !Number.isFinite(Kv)) fail('voltagePlantGain must be a finite number > 0');
  const tb = { kind: 'discrete' as const, samplePeriodS: Ts };
  return {
    current: {
      sections: inputs.currentController.map((s, i) => checkSection(s, `currentController[${i}]`)),
      delaySamples: d,
      plant: zohStateSpace(filterAdmittanceStateSpace(inputs.filter), Ts),
    },
    voltage: { sections: [checkSection(inputs.voltageController, 'voltageController')], delaySamples: 0, plant: { a: [[1]], b: [Kv * Ts], c: [1], d: 0, timebase: tb } },
    pll: { sections: [checkSection(inputs.pllController, 'pllController')], delaySamples: 0, plant: { a: [[1]], b: [Ts], c: [1], d: 0, timebase: tb } },
  };
}

// Block-diagonal controllable-canonical realization of the parallel sections.
function controllerStateSpace(sections: readonly SectionCoefficients[]): { a: Matrix; b: number[]; c: number[]; d: number } {
  const orders = sections.map(sectionOrder);
  const n = orders.reduce((s, k) => s + k, 0);
  const a: Matrix = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  const b = new Array<number>(n).fill(0);
  const c = new Array<number>(n).fill(0);
  let d = 0;
  let o = 0;
  sections.forEach((s, k) => {
    const [b0, b1, b2] = s.b;
    const [, a1, a2] = s.a;
    d += b0;
    if (orders[k] === 2) {
      a[o][o] = -a1; a[o][o + 1] = -a2; a[o + 1][o] = 1;
      b[o] = 1;
      c[o] = b1 - b0 * a1; c[o + 1] = b2 - b0 * a2;
    } else if (orders[k] === 1) {
      a[o][o] = -a1; b[o] = 1; c[o] = b1 - b0 * a1;
    }
    o += orders[k];
  });
  return { a, b, c, d };
}

/**
 * Closed-loop state matrix of a sampled loop with negative unity feedback, states
 * [plant; delay line; controller sections]: x_p+ = A x_p + B u_d, delay s1+ = u_c, s_k+ = s_{k-1},
 * u_d = s_d (u_c when d = 0), controller x_c+ = A_c x_c - B_c C x_p, u_c = C_c x_c - D_c C x_p.
 * The delay contributes d poles at z = 0 in open loop.
 * @param loop - the loop (plant D must be 0).
 * @returns the square closed-loop matrix (size n_plant + d + controller states).
 * @example
 * const plant = { a: [[1]], b: [1], c: [1], d: 0, timebase: { kind: 'discrete', samplePeriodS: 1 } } as const;
 * closedLoopMatrix({ sections: [{ b: [0.5, 0, 0], a: [1, 0, 0] }], delaySamples: 0, plant }); // => [[0.5]]
 */
export function closedLoopMatrix(loop: SampledLoop): Matrix {
  const ctrl = controllerStateSpace(loop.sections);
  const np = loop.plant.a.length;
  const d = loop.delaySamples;
  const nc = ctrl.a.length;
  const N = np + d + nc;
  const M: Matrix = Array.from({ length: N }, () => new Array<number>(N).fill(0));
  const P = loop.plant;
  const oc = np + d;
  for (let i = 0; i < np; i++) for (let j = 0; j < np; j++) M[i][j] = P.a[i][j];
  // u_c row: C_c x_c - D_c C_p x_p
  const ucRow = new Array<number>(N).fill(0);
  for (let j = 0; j < np; j++) ucRow[j] = -ctrl.d * P.c[j];
  for (let j = 0; j < nc; j++) ucRow[oc + j] = ctrl.c[j];
  if (d === 0) {
    for (let i = 0; i < np; i++) for (let j = 0; j < N; j++) M[i][j] += P.b[i] * ucRow[j];
  } else {
    for (let i = 0; i < np; i++) M[i][np + d - 1] += P.b[i];
    for (let j = 0; j < N; j++) M[np][j] = ucRow[j];
    for (let k = 1; k < d; k++) M[np + k][np + k - 1] = 1;
  }
  for (let i = 0; i < nc; i++) {
    for (let j = 0; j < nc; j++) M[oc + i][oc + j] = ctrl.a[i][j];
    for (let j = 0; j < np; j++) M[oc + i][j] -= ctrl.b[i] * P.c[j];
  }
  return M;
}

// Open-loop evaluator L(e^{j w Ts}) of a sampled loop.
function loopEvaluator(loop: SampledLoop): (omegaRadPerS: number) => Complex {
  const Ts = loop.plant.timebase.kind === 'discrete' ? loop.plant.timebase.samplePeriodS : fail('plant must be discrete');
  const tf = ssToTf(loop.plant);
  const num = tf.num;
  const den = tf.den;
  const m = loop.sections.length;
  const sb = loop.sections.map((s) => s.b);
  const sa = loop.sections.map((s) => s.a);
  const d = loop.delaySamples;
  const out: Complex = { re: 0, im: 0 }; // reused: callers read it immediately
  return (w: number): Complex => {
    const th = w * Ts;
    const qr = Math.cos(th);
    const qi = -Math.sin(th); // q = z^-1
    const q2r = qr * qr - qi * qi;
    const q2i = 2 * qr * qi;
    let cr = 0;
    let ci = 0;
    for (let k = 0; k < m; k++) {
      const b = sb[k];
      const a = sa[k];
      const nr = b[0] + b[1] * qr + b[2] * q2r;
      const ni = b[1] * qi + b[2] * q2i;
      const dr = 1 + a[1] * qr + a[2] * q2r;
      const di = a[1] * qi + a[2] * q2i;
      const mag = dr * dr + di * di;
      cr += (nr * dr + ni * di) / mag;
      ci += (ni * dr - nr * di) / mag;
    }
    // z^-d
    const dr = Math.cos(d * th);
    const di = -Math.sin(d * th);
    // plant num(z)/den(z), z = e^{j th}, Horner without allocation
    const zr = qr;
    const zi = -qi;
    let nr = 0, ni = 0, er = 0, ei = 0;
    for (let k = 0; k < num.length; k++) { const t = nr * zr - ni * zi + num[k]; ni = nr * zi + ni * zr; nr = t; }
    for (let k = 0; k < den.length; k++) { const t = er * zr - ei * zi + den[k]; ei = er * zi + ei * zr; er = t; }
    const pm = er * er + ei * ei;
    const pr = (nr * er + ni * ei) / pm;
    const pi = (ni * er - nr * ei) / pm;
    const t1r = cr * dr - ci * di;
    const t1i = cr * di + ci * dr;
    out.re = t1r * pr - t1i * pi;
    out.im = t1r * pi + t1i * pr;
    return out;
  };
}

// Frequencies (rad/s) the margin grid must resolve: complex section poles and plant poles.
function loopFocus(loop: SampledLoop): FrequencyFocus[] {
  const Ts = (loop.plant.timebase as { samplePeriodS: number }).samplePeriodS;
  const focus: FrequencyFocus[] = [];
  const add = (re: number, im: number): void => {
    if (im <= 0) return;
    const r = Math.hypot(re, im);
    const center = Math.atan2(im, re) / Ts;
    const half = Math.max(Math.abs(1 - r) / Ts, center * 1e-7);
    focus.push({ centerRadPerS: center, halfWidthRadPerS: half });
  };
  for (const s of loop.sections) if (sectionOrder(s) === 2) for (const [re, im] of roots([1, s.a[1], s.a[2]])) add(re, im);
  for (const [re, im] of eigenvalues(loop.plant.a)) add(re, im);
  return focus;
}

/**
 * Open-loop poles and zeros of a sampled loop, z plane. Poles: each section's denominator roots,
 * d poles at 0 for the delay, the plant's eigenvalues. Zeros: eigenvalues of A_c - B_c C_c / D_c
 * for the parallel controller (the poles of its inverse, no polynomial expansion) when D_c != 0,
 * plus the plant's numerator roots.
 * @param loop - the loop.
 * @returns poles and zeros as [re, im].
 * @example
 * const plant = { a: [[1]], b: [1], c: [1], d: 0, timebase: { kind: 'discrete', samplePeriodS: 1 } } as const;
 * loopPoleZero({ sections: [{ b: [0.6, -0.4, 0], a: [1, -1, 0] }], delaySamples: 1, plant }); // => poles [[1, 0], [0, 0], [1, 0]], zeros [[0.6667, 0]]
 */
export function loopPoleZero(loop: SampledLoop): PoleZeroMap {
  const ctrl = controllerStateSpace(loop.sections);
  const poles: [number, number][] = [];
  for (const s of loop.sections) {
    const k = sectionOrder(s);
    if (k === 2) poles.push(...roots([1, s.a[1], s.a[2]]));
    else if (k === 1) poles.push([-s.a[1], 0]);
  }
  for (let i = 0; i < loop.delaySamples; i++) poles.push([0, 0]);
  poles.push(...eigenvalues(loop.plant.a));
  const zeros: [number, number][] = [];
  if (ctrl.d !== 0 && ctrl.a.length > 0) {
    const az = ctrl.a.map((row, i) => row.map((v, j) => v - (ctrl.b[i] * ctrl.c[j]) / ctrl.d));
    zeros.push(...eigenvalues(az));
  } else if (ctrl.a.length > 0) {
    // no feedthrough: numerator of the expanded sum (low order only in this case)
    const sys = ssToTf({ a: ctrl.a, b: ctrl.b, c: ctrl.c, d: ctrl.d, timebase: loop.plant.timebase });
    const n = trimLeadingZeros(sys.num);
    if (n.length > 1) zeros.push(...roots(n));
  }
  const ptf = ssToTf(loop.plant);
  const pn = trimLeadingZeros(ptf.num.map((v) => (Math.abs(v) < 1e-14 * Math.max(...ptf.num.map(Math.abs)) ? 0 : v)));
  if (pn.length > 1) zeros.push(...roots(pn));
  return { poles, zeros };
}

const DIVERGENCE_LIMIT = 1e12;

// Horizon of a plotted step response: about six periods of the loop's crossover, so slow loops
// (DC link near 10 Hz, PLL) are shown settling; simulated every sample, recorded every `stride`.
const RESPONSE_CROSSOVER_PERIODS = 6;
const MAX_SIMULATED_SAMPLES = 400000;

function responseStride(samples: number, samplePeriodS: number, crossoverHz: number | null): number {
  if (crossoverHz === null || !(crossoverHz > 0)) return 1;
  const wanted = Math.ceil(RESPONSE_CROSSOVER_PERIODS / crossoverHz / (samples * samplePeriodS));
  return Math.max(1, Math.min(wanted, Math.floor(MAX_SIMULATED_SAMPLES / samples)));
}

function timeResponse(loop: SampledLoop, samples: number, stride: number, reference: number, disturbance: number, record: 'output' | 'error', label: string, notes: string[]): TimeResponseData {
  const Ts = (loop.plant.timebase as { samplePeriodS: number }).samplePeriodS;
  const y = simulateLoop(loop.sections, loop.delaySamples, loop.plant, { reference, inputDisturbance: disturbance }, samples * stride, record);
  const timeS: number[] = [];
  const value: number[] = [];
  for (let i = 0; i < samples * stride; i += stride) {
    const v = y[i];
    if (!Number.isFinite(v) || Math.abs(v) > DIVERGENCE_LIMIT) {
      notes.push(`${label}: the response diverges; truncated after ${i} samples (|value| exceeds ${DIVERGENCE_LIMIT}).`);
      break;
    }
    timeS.push(i * Ts);
    value.push(v);
  }
  return { timeS, value, label };
}

function openLoopSweep(evaluate: (w: number) => Complex, samplePeriodS: number, points: number, notes: string[]): FrequencyResponseData {
  const nyquistHz = 1 / (2 * samplePeriodS);
  const startHz = Math.min(1, nyquistHz / 1000);
  const frequencyHz: number[] = [];
  const magnitudeDb: number[] = [];
  const wrapped: number[] = [];
  let skipped = 0;
  for (const f of logspace(startHz, nyquistHz, points)) {
    const l = evaluate(2 * Math.PI * f);
    const mag = Math.sqrt(l.re * l.re + l.im * l.im);
    if (!Number.isFinite(mag) || mag === 0) { skipped++; continue; }
    frequencyHz.push(f);
    magnitudeDb.push(20 * Math.log10(mag));
    wrapped.push((Math.atan2(l.im, l.re) * 180) / Math.PI);
  }
  if (skipped > 0) notes.push(`open-loop sweep: ${skipped} point(s) on a pole or zero of the unit circle left out.`);
  return { frequencyHz, magnitudeDb, phaseDeg: unwrapDeg(wrapped) };
}

/**
 * Analyses the current, voltage and PLL loops of CONTRACT section 3.
 *
 * Margins by {@link loopMargins} (dense grid with clusters at every resonance, bisection and
 * golden-section refinement); closed-loop poles as eigenvalues of {@link closedLoopMatrix} (Francis
 * QR), maxPoleRadius their largest modulus, stable = every radius < 1. Step responses: current for
 * a 1 A reference step; PLL phase error (rad) for a 1 rad phase step of the linearized loop; DC-link
 * voltage deviation (V) for a 1 A load-current step entering at the plant input of Kv Ts/(z - 1).
 * @param inputs - sampling, delay, filter, controller sections, Kv.
 * @param options - sweepPoints (0 = no sweeps and no pole-zero maps), responseSamples (0 = no time responses).
 * @returns loops (current, voltage, pll), openLoop, poleZero, time.
 * @throws ControlError `invalid-argument` naming the bad field.
 * @example
 * analyzeLoops(inputs, { sweepPoints: 0, responseSamples: 0 }).loops.map((l) => l.id); // => ['current', 'voltage', 'pll']
 */
export function analyzeLoops(inputs: LoopInputs, options: AnalysisOptions): LoopAnalysis {
  const sweepPoints = options.sweepPoints;
  const responseSamples = options.responseSamples;
  if (!Number.isInteger(sweepPoints) || sweepPoints < 0 || sweepPoints > 100000) fail('options.sweepPoints must be an integer from 0 to 100000');
  if (!Number.isInteger(responseSamples) || responseSamples < 0 || responseSamples > 1000000) fail('options.responseSamples must be an integer from 0 to 1000000');
  const built = buildLoops(inputs);
  const ids: LoopId[] = ['current', 'voltage', 'pll'];
  const Ts = inputs.samplePeriodS;
  const loops: LoopResult[] = [];
  const evaluators = {} as Record<LoopId, (w: number) => Complex>;
  for (const id of ids) {
    const loop = built[id];
    const evaluate = loopEvaluator(loop);
    evaluators[id] = evaluate;
    const margins = loopMargins(evaluate, Ts, loopFocus(loop));
    const poles = eigenvalues(closedLoopMatrix(loop));
    let maxPoleRadius = 0;
    for (const [re, im] of poles) maxPoleRadius = Math.max(maxPoleRadius, Math.hypot(re, im));
    loops.push({
      id,
      crossoverHz: margins.crossoverHz,
      phaseMarginDeg: margins.phaseMarginDeg,
      gainMarginDb: margins.gainMarginDb,
      peakSensitivity: margins.peakSensitivity,
      closedLoopPoles: poles.map(([re, im]) => [re, im] as [number, number]),
      maxPoleRadius,
      stable: maxPoleRadius < 1,
      crossings: margins.crossings,
      notes: margins.notes,
    });
  }
  const notesOf = (id: LoopId): string[] => loops[ids.indexOf(id)].notes ?? [];
  const openLoop = sweepPoints === 0 ? null : {
    current: openLoopSweep(evaluators.current, Ts, sweepPoints, notesOf('current')),
    voltage: openLoopSweep(evaluators.voltage, Ts, sweepPoints, notesOf('voltage')),
    pll: openLoopSweep(evaluators.pll, Ts, sweepPoints, notesOf('pll')),
  };
  const poleZero = sweepPoints === 0 ? null : { current: loopPoleZero(built.current), voltage: loopPoleZero(built.voltage), pll: loopPoleZero(built.pll) };
  const time = responseSamples === 0 ? null : {
    'current-step': timeResponse(built.current, responseSamples, 1, 1, 0, 'output', 'inverter current (A) for a 1 A reference step', notesOf('current')),
    'pll-phase-step': timeResponse(built.pll, responseSamples, responseStride(responseSamples, Ts, loops[ids.indexOf('pll')].crossoverHz), 1, 0, 'error', 'PLL phase error (rad) after a 1 rad grid phase step (linearized loop)', notesOf('pll')),
    'dc-link-load-step': timeResponse(built.voltage, responseSamples, responseStride(responseSamples, Ts, loops[ids.indexOf('voltage')].crossoverHz), 0, -1, 'output', 'DC-link voltage deviation (V) after a 1 A load-current step', notesOf('voltage')),
  };
  return { loops, openLoop, poleZero, time };
}
