/**
 * Stability margins of a sampled open loop L(e^{j w Ts}) from 0 to the Nyquist frequency: every
 * unity-gain and -180 degree crossing, the highest crossover, the worst phase and gain margins and
 * the peak sensitivity.
 *
 * Method: a dense grid (log-spaced over seven decades below Nyquist plus clusters around each given
 * narrow feature, e.g. a resonator's centre frequency) locates sign changes of |L| - 1 and of Im L,
 * which bisection refines to machine precision; the peak of |1/(1 + L)| is refined by golden-section
 * search (Skogestad & Postlethwaite, "Multivariable Feedback Control", 2005, for Ms).
 */
import { ControlError } from './errors';
import type { Complex } from './polynomial';
import type { LoopCrossing } from './types';

/** A narrow frequency feature the grid must resolve: a centre and a half-width, both in rad/s. */
export interface FrequencyFocus {
  centerRadPerS: number;
  halfWidthRadPerS: number;
}

/** Margins of one open loop. Absent values are null with a reason in `notes`. */
export interface MarginResult {
  /** Highest unity-gain crossing in Hz, null when |L| never crosses 1. */
  crossoverHz: number | null;
  /** Worst (smallest) phase margin over all unity-gain crossings, degrees in (-180, 180]. */
  phaseMarginDeg: number | null;
  /** Worst gain margin over the -180 degree crossings with |L| < 1, dB. */
  gainMarginDb: number | null;
  /** max over 0 < w <= pi/Ts of |1/(1 + L)|. */
  peakSensitivity: number;
  /** Frequency of the peak sensitivity in Hz. */
  peakSensitivityHz: number;
  crossings: LoopCrossing[];
  notes: string[];
}

const GRID_DECADES = 7;
const GRID_POINTS = 3500;
const FOCUS_POINTS = 48;

/**
 * The evaluation grid used by {@link loopMargins}: log-spaced from pi/Ts * 1e-7 to pi/Ts plus
 * clusters at center +- halfWidth * g, g log-spaced in [1e-3, 1e3], for each focus.
 * @param samplePeriodS - Ts in s (> 0).
 * @param focus - narrow features to resolve.
 * @returns ascending, de-duplicated angular frequencies in rad/s, the last one exactly pi/Ts.
 * @example
 * marginGrid(5e-5, []).at(-1); // => 62831.85...
 */
export function marginGrid(samplePeriodS: number, focus: readonly FrequencyFocus[]): number[] {
  const wN = Math.PI / samplePeriodS;
  const logW0 = Math.log(wN) - GRID_DECADES * Math.LN10;
  const step = (GRID_DECADES * Math.LN10) / (GRID_POINTS - 1);
  const valid = focus.filter((f) => f.centerRadPerS > 0 && f.halfWidthRadPerS > 0 && Number.isFinite(f.centerRadPerS) && Number.isFinite(f.halfWidthRadPerS));
  const extra = new Float64Array(2 * FOCUS_POINTS * valid.length);
  let k = 0;
  const gStep = (6 * Math.LN10) / (FOCUS_POINTS - 1);
  for (const f of valid) {
    for (let i = 0; i < FOCUS_POINTS; i++) {
      const off = f.halfWidthRadPerS * Math.exp(-3 * Math.LN10 + i * gStep);
      extra[k++] = f.centerRadPerS - off;
      extra[k++] = f.centerRadPerS + off;
    }
  }
  extra.sort();
  // merge the ascending base grid with the sorted focus points, dropping duplicates and w outside (0, wN)
  const out: number[] = [];
  let i = 0;
  let j = 0;
  let base = Math.exp(logW0);
  while (i < GRID_POINTS || j < extra.length) {
    let w: number;
    if (j >= extra.length || (i < GRID_POINTS && base <= extra[j])) {
      w = base;
      i++;
      base = Math.exp(logW0 + i * step);
    } else w = extra[j++];
    if (!(w > 0) || w >= wN) continue;
    if (out.length === 0 || w > out[out.length - 1] * (1 + 1e-13)) out.push(w);
  }
  out.push(wN);
  return out;
}

function bisect(f: (w: number) => number, lo: number, hi: number, flo: number): number {
  let a = lo;
  let b = hi;
  let fa = flo;
  for (let i = 0; i < 200 && b - a > 1e-14 * b; i++) {
    const m = 0.5 * (a + b);
    const fm = f(m);
    if (!Number.isFinite(fm)) return m;
    if (fm === 0) return m;
    if ((fm < 0) === (fa < 0)) { a = m; fa = fm; } else b = m;
  }
  return 0.5 * (a + b);
}

function golden(f: (w: number) => number, lo: number, hi: number): number {
  const r = (Math.sqrt(5) - 1) / 2;
  let a = lo;
  let b = hi;
  let c = b - r * (b - a);
  let d = a + r * (b - a);
  let fc = f(c);
  let fd = f(d);
  for (let i = 0; i < 200 && b - a > 1e-13 * b; i++) {
    if (fc > fd) { b = d; d = c; fd = fc; c = b - r * (b - a); fc = f(c); } else { a = c; c = d; fc = fd; d = a + r * (b - a); fd = f(d); }
  }
  return Math.max(fc, fd);
}

/**
 * Margins of a sampled open loop given as an evaluator of L at real frequencies.
 *
 * Definitions (CONTRACT section 3): crossover = highest w with |L| = 1; phase margin = 180 deg +
 * arg L at each such w, wrapped to (-180, 180], worst (smallest) one reported; gain margin =
 * -20 log10 |L| at each w where L is real and negative with |L| < 1 (including w = pi/Ts), the
 * smallest reported; peak sensitivity Ms = max |1/(1 + L)| (Skogestad & Postlethwaite 2005).
 * @param evaluate - L at angular frequency w (rad/s), as { re, im } (non-finite at poles on the unit circle); the
 *   returned object may be reused by the evaluator, it is read immediately.
 * @param samplePeriodS - Ts in s (> 0).
 * @param focus - narrow features (resonances) to sample densely.
 * @returns the margins; null values carry a sentence in `notes`.
 * @throws ControlError `invalid-argument` for a bad period.
 * @example
 * // L = 0.5 / (e^{jw} - 1), Ts = 1 s: |L| = 1 where 2 sin(w/2) = 0.5, phase margin 90 - w/2 in degrees
 * loopMargins((w) => { const dr = Math.cos(w) - 1, di = Math.sin(w), m = dr * dr + di * di; return { re: (0.5 * dr) / m, im: (-0.5 * di) / m }; }, 1, []).phaseMarginDeg; // => 75.52...
 */
export function loopMargins(evaluate: (omegaRadPerS: number) => Complex, samplePeriodS: number, focus: readonly FrequencyFocus[]): MarginResult {
  if (!(samplePeriodS > 0) || !Number.isFinite(samplePeriodS)) throw new ControlError('invalid-argument', 'samplePeriodS must be a finite number > 0');
  const grid = marginGrid(samplePeriodS, focus);
  const n = grid.length;
  const re = new Float64Array(n);
  const im = new Float64Array(n);
  const logMag = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const l = evaluate(grid[i]);
    re[i] = l.re;
    im[i] = l.im;
    logMag[i] = 0.5 * Math.log(l.re * l.re + l.im * l.im);
  }
  const logMagAt = (w: number): number => { const l = evaluate(w); return 0.5 * Math.log(l.re * l.re + l.im * l.im); };
  const imAt = (w: number): number => evaluate(w).im;
  const toHz = (w: number): number => w / (2 * Math.PI);
  const crossings: LoopCrossing[] = [];
  const gainCrossings: number[] = [];
  const phaseCrossings: number[] = [];
  for (let i = 0; i + 1 < n; i++) {
    const a = logMag[i];
    const b = logMag[i + 1];
    if (Number.isFinite(a) && Number.isFinite(b) && (a < 0) !== (b < 0)) gainCrossings.push(a === 0 ? grid[i] : bisect(logMagAt, grid[i], grid[i + 1], a));
    const ia = im[i];
    const ib = im[i + 1];
    if (Number.isFinite(ia) && Number.isFinite(ib) && (ia < 0) !== (ib < 0) && (re[i] < 0 || re[i + 1] < 0)) {
      phaseCrossings.push(ia === 0 ? grid[i] : bisect(imAt, grid[i], grid[i + 1], ia));
    }
  }
  // At w = pi/Ts the loop is real: a negative value is a -180 degree crossing of the Nyquist curve.
  if (re[n - 1] < 0 && Number.isFinite(re[n - 1])) phaseCrossings.push(grid[n - 1]);
  let phaseMarginDeg: number | null = null;
  let crossoverRadPerS: number | null = null;
  for (const w of gainCrossings) {
    const l = evaluate(w);
    let pm = (Math.atan2(l.im, l.re) * 180) / Math.PI + 180;
    if (pm > 180) pm -= 360;
    crossings.push({ frequencyHz: toHz(w), marginValue: pm, kind: 'gain-crossover' });
    if (phaseMarginDeg === null || pm < phaseMarginDeg) phaseMarginDeg = pm;
    if (crossoverRadPerS === null || w > crossoverRadPerS) crossoverRadPerS = w;
  }
  let gainMarginDb: number | null = null;
  let lastPhase = -1;
  for (const w of phaseCrossings) {
    if (lastPhase > 0 && Math.abs(w - lastPhase) <= 1e-9 * w) continue;
    lastPhase = w;
    const l = evaluate(w);
    const mag = Math.hypot(l.re, l.im);
    if (!(l.re < 0) || !(mag < 1) || !Number.isFinite(mag) || mag === 0) continue;
    const gm = -20 * Math.log10(mag);
    crossings.push({ frequencyHz: toHz(w), marginValue: gm, kind: 'phase-crossover' });
    if (gainMarginDb === null || gm < gainMarginDb) gainMarginDb = gm;
  }
  crossings.sort((p, q) => p.frequencyHz - q.frequencyHz);
  // Peak sensitivity: best grid points, then golden-section refinement between neighbours.
  const sens = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const s = 1 / Math.sqrt((1 + re[i]) * (1 + re[i]) + im[i] * im[i]);
    sens[i] = Number.isFinite(s) ? s : 0;
  }
  let best = 0;
  for (let i = 1; i < n; i++) if (sens[i] > sens[best]) best = i;
  let peak = sens[best];
  let peakW = grid[best];
  const sensAt = (w: number): number => { const l = evaluate(w); const s = 1 / Math.sqrt((1 + l.re) * (1 + l.re) + l.im * l.im); return Number.isFinite(s) ? s : 0; };
  const candidates: number[] = [];
  for (let i = 0; i < n; i++) {
    const left = i > 0 ? sens[i - 1] : -1;
    const right = i + 1 < n ? sens[i + 1] : -1;
    if (sens[i] >= left && sens[i] >= right && sens[i] > 0.8 * sens[best]) candidates.push(i);
  }
  for (const i of candidates.slice(0, 16)) {
    const lo = grid[Math.max(0, i - 1)];
    const hi = grid[Math.min(n - 1, i + 1)];
    if (hi <= lo) continue;
    const v = golden(sensAt, lo, hi);
    if (v > peak) { peak = v; peakW = grid[i]; }
  }
  const notes: string[] = [];
  if (crossoverRadPerS === null) notes.push('|L| does not cross 1 between 0 and the Nyquist frequency: no crossover and no phase margin.');
  if (gainMarginDb === null) notes.push('No -180 degree crossing with |L| < 1 between 0 and the Nyquist frequency: gain margin unbounded.');
  return {
    crossoverHz: crossoverRadPerS === null ? null : toHz(crossoverRadPerS),
    phaseMarginDeg,
    gainMarginDb,
    peakSensitivity: peak,
    peakSensitivityHz: toHz(peakW),
    crossings,
    notes,
  };
}
