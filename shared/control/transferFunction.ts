/**
 * SISO transfer functions with an explicit timebase (STYLE habits 6 and 7).
 *
 * `num` and `den` are in DESCENDING powers of s (continuous) or z (discrete); `num` is zero-padded
 * on the left to `den`'s length, so for a proper discrete system the same arrays read as powers of
 * z^-1: H = (num[0] + num[1] z^-1 + ...)/(den[0] + den[1] z^-1 + ...).
 */
import { ControlError, ImproperTransferFunctionError, TimebaseMismatchError } from './errors';
import { polyAdd, polyMul, polyvalComplex, trimLeadingZeros, type Complex } from './polynomial';
import type { StateSpace } from './stateSpace';
import { characteristicPolynomial, matMul, stateCount } from './stateSpace';

/** Continuous (s) or discrete (z, with its sampling period in seconds). */
export type Timebase = { kind: 'continuous' } | { kind: 'discrete'; samplePeriodS: number };

/** A proper SISO transfer function num/den with its timebase. */
export interface TransferFunction {
  num: number[];
  den: number[];
  timebase: Timebase;
}

/**
 * Builds a proper transfer function, trimming leading zeros of `den` and left-padding `num`.
 * @param num - numerator, descending powers.
 * @param den - denominator, descending powers, not all zero.
 * @param timebase - continuous or discrete with `samplePeriodS` > 0.
 * @returns the transfer function with num.length === den.length.
 * @throws ImproperTransferFunctionError when deg num > deg den; ControlError for a zero or non-finite denominator or bad period.
 * @example
 * transferFunction([1], [1, 1], { kind: 'continuous' }); // => { num: [0, 1], den: [1, 1], ... }
 */
export function transferFunction(num: readonly number[], den: readonly number[], timebase: Timebase): TransferFunction {
  if ([...num, ...den].some((c) => !Number.isFinite(c))) throw new ControlError('invalid-argument', 'transferFunction: coefficients must be finite');
  if (timebase.kind === 'discrete' && !(timebase.samplePeriodS > 0 && Number.isFinite(timebase.samplePeriodS))) {
    throw new ControlError('invalid-argument', 'transferFunction: samplePeriodS must be a finite number > 0');
  }
  const d = trimLeadingZeros(den);
  if (d.length === 1 && d[0] === 0) throw new ControlError('invalid-argument', 'transferFunction: the denominator is zero');
  const n = trimLeadingZeros(num);
  const nDeg = n.length === 1 && n[0] === 0 ? 0 : n.length - 1;
  if (nDeg > d.length - 1) throw new ImproperTransferFunctionError(`numerator degree ${nDeg} > denominator degree ${d.length - 1}`);
  const padded = new Array<number>(d.length - n.length).fill(0).concat(n);
  return { num: padded, den: d, timebase };
}

/**
 * Throws unless two timebases are equal (both continuous, or discrete with the same period).
 * @param a - first timebase.
 * @param b - second timebase.
 * @returns the common timebase.
 * @throws TimebaseMismatchError when they differ.
 * @example
 * commonTimebase({ kind: 'continuous' }, { kind: 'continuous' }); // => { kind: 'continuous' }
 */
export function commonTimebase(a: Timebase, b: Timebase): Timebase {
  const describe = (t: Timebase): string => (t.kind === 'continuous' ? 'continuous' : `discrete Ts = ${t.samplePeriodS} s`);
  if (a.kind !== b.kind || (a.kind === 'discrete' && b.kind === 'discrete' && a.samplePeriodS !== b.samplePeriodS)) {
    throw new TimebaseMismatchError(`cannot combine ${describe(a)} with ${describe(b)}`);
  }
  return a;
}

/**
 * Series connection G1 G2.
 * @param g1 - first system.
 * @param g2 - second system, same timebase.
 * @returns the product.
 * @throws TimebaseMismatchError when the timebases differ.
 * @example
 * series(transferFunction([1], [1, 0], c), transferFunction([2], [1, 1], c)); // => num [0, 0, 2], den [1, 1, 0]  (c = { kind: 'continuous' })
 */
export function series(g1: TransferFunction, g2: TransferFunction): TransferFunction {
  const tb = commonTimebase(g1.timebase, g2.timebase);
  return transferFunction(polyMul(g1.num, g2.num), polyMul(g1.den, g2.den), tb);
}

/**
 * Parallel connection G1 + G2 (expands the polynomials: use only for low orders; analyse sums of
 * resonators as parallel sections instead).
 * @param g1 - first system.
 * @param g2 - second system, same timebase.
 * @returns the sum.
 * @throws TimebaseMismatchError when the timebases differ.
 * @example
 * parallel(transferFunction([1], [1], c), transferFunction([1], [1, 0], c)); // => num [1, 1], den [1, 0]
 */
export function parallel(g1: TransferFunction, g2: TransferFunction): TransferFunction {
  const tb = commonTimebase(g1.timebase, g2.timebase);
  return transferFunction(polyAdd(polyMul(g1.num, g2.den), polyMul(g2.num, g1.den)), polyMul(g1.den, g2.den), tb);
}

/**
 * Negative unity feedback G / (1 + G).
 * @param g - open loop.
 * @returns the closed loop.
 * @example
 * unityFeedback(transferFunction([1], [1, 0], c)); // => num [0, 1], den [1, 1]
 */
export function unityFeedback(g: TransferFunction): TransferFunction {
  return transferFunction(g.num, polyAdd(g.den, g.num), g.timebase);
}

/**
 * Evaluates H at a complex point (s for continuous, z for discrete).
 * @param g - the system.
 * @param re - real part of the point.
 * @param im - imaginary part of the point.
 * @returns H(point); non-finite parts at a pole.
 * @example
 * evaluateTf(transferFunction([1], [1, 1], c), 0, 0); // => { re: 1, im: 0 }
 */
export function evaluateTf(g: TransferFunction, re: number, im: number): Complex {
  const n = polyvalComplex(g.num, re, im);
  const d = polyvalComplex(g.den, re, im);
  const m = d.re * d.re + d.im * d.im;
  return { re: (n.re * d.re + n.im * d.im) / m, im: (n.im * d.re - n.re * d.im) / m };
}

/**
 * Controllable canonical state-space realization of a proper transfer function.
 *
 * Method: den normalized to monic, D = num0, strictly proper remainder r; A has -den[1..n] in its
 * first row and ones on the subdiagonal, B = e1, C = r (Franklin, Powell & Workman 1998 [from memory]; scipy.signal.tf2ss uses the same form).
 * @param g - proper transfer function.
 * @returns { a, b, c, d, timebase }.
 * @example
 * tfToSs(transferFunction([1], [1, 2], c)); // => { a: [[-2]], b: [1], c: [1], d: 0, timebase: c }
 */
export function tfToSs(g: TransferFunction): StateSpace {
  const lead = g.den[0];
  const den = g.den.map((c) => c / lead);
  const num = g.num.map((c) => c / lead);
  const n = den.length - 1;
  const d = num[0];
  const c = [];
  for (let i = 1; i <= n; i++) c.push(num[i] - d * den[i]);
  const a: number[][] = [];
  for (let i = 0; i < n; i++) {
    const row = new Array<number>(n).fill(0);
    if (i === 0) for (let j = 0; j < n; j++) row[j] = -den[j + 1];
    else row[i - 1] = 1;
    a.push(row);
  }
  const b = new Array<number>(n).fill(0);
  if (n > 0) b[0] = 1;
  return { a, b, c, d, timebase: g.timebase };
}

/**
 * Transfer function of a SISO state-space model.
 *
 * Method: den = det(sI - A); num = det(sI - A + B C) - det(sI - A) + D det(sI - A) (the SISO
 * determinant identity det(I + X Y) = 1 + Y X). Characteristic polynomials by Faddeev-LeVerrier:
 * for small (n <= 4), well-scaled models only.
 * @param sys - SISO model.
 * @returns the transfer function (same timebase).
 * @example
 * ssToTf({ a: [[-2]], b: [1], c: [1], d: 0, timebase: { kind: 'continuous' } }); // => [0, 1] / [1, 2]
 */
export function ssToTf(sys: StateSpace): TransferFunction {
  const n = stateCount(sys);
  const den = characteristicPolynomial(sys.a);
  const bc = matMul(sys.b.map((v) => [v]), [sys.c]);
  const abc = sys.a.map((row, i) => row.map((v, j) => v - bc[i][j]));
  const p2 = characteristicPolynomial(abc);
  const num = p2.map((v, i) => v - den[i] + sys.d * den[i]);
  if (n === 0) return transferFunction([sys.d], [1], sys.timebase);
  return transferFunction(num, den, sys.timebase);
}
