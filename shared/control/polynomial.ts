/**
 * Real polynomials in descending powers: p = [p0, p1, ..., pn] means p0 x^n + p1 x^(n-1) + ... + pn.
 */
import { ControlError } from './errors';
import { eigenvalues } from './stateSpace';

/** A complex number. */
export interface Complex { re: number; im: number }

/**
 * Evaluates a real polynomial at a complex point (Horner's scheme).
 * @param p - coefficients, descending powers.
 * @param re - real part of x.
 * @param im - imaginary part of x.
 * @returns p(x) as { re, im }; { re: 0, im: 0 } for an empty polynomial.
 * @example
 * polyvalComplex([1, 0, 1], 0, 1); // => { re: 0, im: 0 }  (x^2 + 1 at x = j)
 */
export function polyvalComplex(p: readonly number[], re: number, im: number): Complex {
  let yr = 0;
  let yi = 0;
  for (const c of p) {
    const tr = yr * re - yi * im + c;
    yi = yr * im + yi * re;
    yr = tr;
  }
  return { re: yr, im: yi };
}

/**
 * Evaluates a real polynomial at a real point (Horner's scheme).
 * @param p - coefficients, descending powers.
 * @param x - the point.
 * @returns p(x); 0 for an empty polynomial.
 * @example
 * polyval([1, -3, 2], 1); // => 0
 */
export function polyval(p: readonly number[], x: number): number {
  let y = 0;
  for (const c of p) y = y * x + c;
  return y;
}

/**
 * Product of two polynomials (convolution of the coefficient lists).
 * @param p - descending powers.
 * @param q - descending powers.
 * @returns p q, descending powers, length len(p) + len(q) - 1 (empty if either is empty).
 * @example
 * polyMul([1, 1], [1, -1]); // => [1, 0, -1]
 */
export function polyMul(p: readonly number[], q: readonly number[]): number[] {
  if (p.length === 0 || q.length === 0) return [];
  const out = new Array<number>(p.length + q.length - 1).fill(0);
  for (let i = 0; i < p.length; i++) for (let j = 0; j < q.length; j++) out[i + j] += p[i] * q[j];
  return out;
}

/**
 * Sum of two polynomials, aligned at the constant term.
 * @param p - descending powers.
 * @param q - descending powers.
 * @returns p + q, descending powers, length max(len p, len q).
 * @example
 * polyAdd([1, 0, 0], [2, 3]); // => [1, 2, 3]
 */
export function polyAdd(p: readonly number[], q: readonly number[]): number[] {
  const n = Math.max(p.length, q.length);
  const out = new Array<number>(n).fill(0);
  for (let i = 0; i < p.length; i++) out[n - p.length + i] += p[i];
  for (let i = 0; i < q.length; i++) out[n - q.length + i] += q[i];
  return out;
}

/**
 * Removes leading zero coefficients (keeps at least one entry).
 * @param p - descending powers.
 * @returns p without leading exact zeros; [0] for the zero polynomial.
 * @example
 * trimLeadingZeros([0, 0, 1, 2]); // => [1, 2]
 */
export function trimLeadingZeros(p: readonly number[]): number[] {
  let i = 0;
  while (i < p.length - 1 && p[i] === 0) i++;
  return p.length === 0 ? [0] : p.slice(i);
}

/**
 * Roots of a real polynomial.
 *
 * Method: eigenvalues of the companion matrix (balanced, Hessenberg QR), as numpy.roots does;
 * degree 1 and 2 in closed form (the quadratic with the cancellation-free formula, Press et al.,
 * "Numerical Recipes", 1992, section 5.6). Exact zero trailing coefficients give roots at 0.
 * @param p - descending powers; leading zeros are ignored.
 * @returns the roots as [re, im] (complex roots in conjugate pairs), unordered; [] for a constant.
 * @throws ControlError `invalid-argument` for a non-finite coefficient or the zero polynomial.
 * @example
 * roots([1, -3, 2]); // => [[2, 0], [1, 0]]
 */
export function roots(p: readonly number[]): [number, number][] {
  if (p.some((c) => !Number.isFinite(c))) throw new ControlError('invalid-argument', 'roots: coefficients must be finite');
  const q = trimLeadingZeros(p);
  if (q.length === 1 && q[0] === 0) throw new ControlError('invalid-argument', 'roots: the zero polynomial has no defined roots');
  const out: [number, number][] = [];
  let end = q.length;
  while (end > 1 && q[end - 1] === 0) { out.push([0, 0]); end--; }
  const r = q.slice(0, end);
  const degree = r.length - 1;
  if (degree === 0) return out;
  if (degree === 1) { out.push([-r[1] / r[0], 0]); return out; }
  if (degree === 2) {
    const [a, b, c] = r;
    const disc = b * b - 4 * a * c;
    if (disc >= 0) {
      const qq = -0.5 * (b + (b >= 0 ? 1 : -1) * Math.sqrt(disc));
      out.push([qq / a, 0], [c / qq, 0]);
    } else {
      const re = -b / (2 * a);
      const im = Math.sqrt(-disc) / (2 * Math.abs(a));
      out.push([re, im], [re, -im]);
    }
    return out;
  }
  const companion: number[][] = [];
  for (let i = 0; i < degree; i++) {
    const row = new Array<number>(degree).fill(0);
    if (i === 0) for (let j = 0; j < degree; j++) row[j] = -r[j + 1] / r[0];
    else row[i - 1] = 1;
    companion.push(row);
  }
  return out.concat(eigenvalues(companion));
}
