/**
 * Small dense linear algebra for single-input single-output state-space models: matrix
 * exponential, eigenvalues of non-symmetric matrices (balancing, Hessenberg reduction and the
 * Francis double-shift QR iteration), characteristic polynomials, and SISO state-space models.
 *
 * Matrices are `number[][]` (row-major, rows of equal length). Plain Float64 loops throughout.
 */
import { DimensionError, ControlError, MimoNotSupportedError } from './errors';
import type { Timebase } from './transferFunction';

/** A dense real matrix, row-major: `m[i][j]` is row i, column j. */
export type Matrix = number[][];

/**
 * SISO state-space model x' = A x + B u, y = C x + D u (continuous) or x[n+1] = A x[n] + B u[n] (discrete).
 * `b` is the input column (length n), `c` the output row (length n), `d` the feedthrough.
 */
export interface StateSpace {
  a: Matrix;
  b: number[];
  c: number[];
  d: number;
  timebase: Timebase;
}

/**
 * Identity matrix.
 * @param n - size (>= 0).
 * @returns the n x n identity.
 * @example
 * identity(2); // => [[1, 0], [0, 1]]
 */
export function identity(n: number): Matrix {
  return Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? 1 : 0)));
}

/**
 * Matrix product A B.
 * @param a - p x q matrix.
 * @param b - q x r matrix.
 * @returns the p x r product.
 * @example
 * matMul([[1, 2]], [[3], [4]]); // => [[11]]
 */
export function matMul(a: Matrix, b: Matrix): Matrix {
  const p = a.length;
  const q = b.length;
  const r = q === 0 ? 0 : b[0].length;
  if (p > 0 && a[0].length !== q) throw new DimensionError(`matMul: ${p}x${a[0].length} times ${q}x${r}`);
  const out: Matrix = [];
  for (let i = 0; i < p; i++) {
    const row = new Array<number>(r).fill(0);
    const ai = a[i];
    for (let k = 0; k < q; k++) {
      const aik = ai[k];
      if (aik === 0) continue;
      const bk = b[k];
      for (let j = 0; j < r; j++) row[j] += aik * bk[j];
    }
    out.push(row);
  }
  return out;
}

function checkSquare(a: Matrix, what: string): number {
  const n = a.length;
  for (const row of a) if (row.length !== n) throw new DimensionError(`${what}: matrix is not square (${n} rows, a row of ${row.length})`);
  return n;
}

/**
 * Solves A X = B by LU decomposition with partial pivoting.
 * @param a - n x n matrix (not modified).
 * @param b - n x m right-hand sides (not modified).
 * @returns X, n x m.
 * @throws ControlError `invalid-argument` when A is singular to working precision.
 * @example
 * solve([[2, 0], [0, 4]], [[2], [2]]); // => [[1], [0.5]]
 */
export function solve(a: Matrix, b: Matrix): Matrix {
  const n = checkSquare(a, 'solve');
  if (b.length !== n) throw new DimensionError(`solve: A is ${n}x${n}, B has ${b.length} rows`);
  const lu = a.map((r) => r.slice());
  const x = b.map((r) => r.slice());
  const m = n === 0 ? 0 : x[0].length;
  for (let k = 0; k < n; k++) {
    let piv = k;
    for (let i = k + 1; i < n; i++) if (Math.abs(lu[i][k]) > Math.abs(lu[piv][k])) piv = i;
    if (lu[piv][k] === 0) throw new ControlError('invalid-argument', 'solve: matrix is singular');
    if (piv !== k) {
      [lu[piv], lu[k]] = [lu[k], lu[piv]];
      [x[piv], x[k]] = [x[k], x[piv]];
    }
    for (let i = k + 1; i < n; i++) {
      const f = lu[i][k] / lu[k][k];
      if (f === 0) continue;
      for (let j = k; j < n; j++) lu[i][j] -= f * lu[k][j];
      for (let j = 0; j < m; j++) x[i][j] -= f * x[k][j];
    }
  }
  for (let k = n - 1; k >= 0; k--) {
    for (let j = 0; j < m; j++) {
      let s = x[k][j];
      for (let i = k + 1; i < n; i++) s -= lu[k][i] * x[i][j];
      x[k][j] = s / lu[k][k];
    }
  }
  return x;
}

/**
 * Matrix exponential e^A.
 *
 * Method: scaling and squaring with the diagonal (6,6) Padé approximant (Moler & Van Loan,
 * "Nineteen dubious ways to compute the exponential of a matrix, twenty-five years later", SIAM Review 2003).
 * @param a - n x n matrix (dimensionless, e.g. A*Ts).
 * @returns e^A, n x n.
 * @example
 * expm([[0]]); // => [[1]]
 */
export function expm(a: Matrix): Matrix {
  const n = checkSquare(a, 'expm');
  if (n === 0) return [];
  let norm = 0;
  for (const row of a) norm = Math.max(norm, row.reduce((s, v) => s + Math.abs(v), 0));
  const squarings = norm > 0.5 ? Math.max(0, Math.ceil(Math.log2(norm / 0.5))) : 0;
  const scale = 2 ** -squarings;
  const as = a.map((r) => r.map((v) => v * scale));
  // Padé (6,6) coefficients c_k = (2q-k)! q! / ((2q)! k! (q-k)!), q = 6 (Moler & Van Loan 2003).
  const q = 6;
  let c = 1;
  let x = identity(n);
  const num = identity(n);
  const den = identity(n);
  for (let k = 1; k <= q; k++) {
    c = (c * (q - k + 1)) / (k * (2 * q - k + 1));
    x = matMul(as, x);
    const sign = k % 2 === 0 ? 1 : -1;
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        num[i][j] += c * x[i][j];
        den[i][j] += sign * c * x[i][j];
      }
    }
  }
  let e = solve(den, num);
  for (let s = 0; s < squarings; s++) e = matMul(e, e);
  return e;
}

/**
 * Eigenvalues of a real square matrix.
 *
 * Method: balancing (Parlett & Reinsch 1969), reduction to upper Hessenberg form by stabilized
 * elementary similarity transformations, then the Francis double-shift QR iteration (Wilkinson &
 * Reinsch, "Handbook for Automatic Computation II: Linear Algebra", 1971, procedures balance,
 * elmhes, hqr; as in Press et al., "Numerical Recipes", 1992). Plain Float64Array arithmetic.
 * @param a - n x n real matrix (not modified).
 * @returns the n eigenvalues as [re, im] pairs, complex ones in conjugate pairs, unordered.
 * @throws ControlError `no-convergence` if the QR iteration does not converge in 60 iterations per eigenvalue.
 * @example
 * eigenvalues([[0, -1], [1, 0]]); // => [[0, 1], [0, -1]]
 */
export function eigenvalues(a: Matrix): [number, number][] {
  const n = checkSquare(a, 'eigenvalues');
  if (n === 0) return [];
  const w = n + 1;
  // 1-indexed working copy: h[i*w + j], i, j in 1..n
  const h = new Float64Array(w * w);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) {
    const v = a[i][j];
    if (!Number.isFinite(v)) throw new ControlError('invalid-argument', `eigenvalues: entry (${i}, ${j}) is not finite`);
    h[(i + 1) * w + j + 1] = v;
  }
  balance(h, n, w);
  hessenberg(h, n, w);
  const wr = new Float64Array(w);
  const wi = new Float64Array(w);
  hqr(h, n, w, wr, wi);
  const out: [number, number][] = [];
  for (let i = 1; i <= n; i++) out.push([wr[i], wi[i]]);
  return out;
}

function balance(h: Float64Array, n: number, w: number): void {
  const radix = 2;
  const sqrdx = radix * radix;
  let done = false;
  while (!done) {
    done = true;
    for (let i = 1; i <= n; i++) {
      let r = 0;
      let c = 0;
      for (let j = 1; j <= n; j++) {
        if (j === i) continue;
        c += Math.abs(h[j * w + i]);
        r += Math.abs(h[i * w + j]);
      }
      if (c !== 0 && r !== 0) {
        let g = r / radix;
        let f = 1;
        const s = c + r;
        while (c < g) { f *= radix; c *= sqrdx; }
        g = r * radix;
        while (c > g) { f /= radix; c /= sqrdx; }
        if ((c + r) / f < 0.95 * s) {
          done = false;
          g = 1 / f;
          for (let j = 1; j <= n; j++) h[i * w + j] *= g;
          for (let j = 1; j <= n; j++) h[j * w + i] *= f;
        }
      }
    }
  }
}

function hessenberg(h: Float64Array, n: number, w: number): void {
  for (let m = 2; m < n; m++) {
    let x = 0;
    let i = m;
    for (let j = m; j <= n; j++) {
      if (Math.abs(h[j * w + m - 1]) > Math.abs(x)) { x = h[j * w + m - 1]; i = j; }
    }
    if (i !== m) {
      for (let j = m - 1; j <= n; j++) { const t = h[i * w + j]; h[i * w + j] = h[m * w + j]; h[m * w + j] = t; }
      for (let j = 1; j <= n; j++) { const t = h[j * w + i]; h[j * w + i] = h[j * w + m]; h[j * w + m] = t; }
    }
    if (x !== 0) {
      for (i = m + 1; i <= n; i++) {
        let y = h[i * w + m - 1];
        if (y !== 0) {
          y /= x;
          h[i * w + m - 1] = y;
          for (let j = m; j <= n; j++) h[i * w + j] -= y * h[m * w + j];
          for (let j = 1; j <= n; j++) h[j * w + m] += y * h[j * w + i];
        }
      }
    }
  }
  for (let i = 3; i <= n; i++) for (let j = 1; j <= i - 2; j++) h[i * w + j] = 0;
}

function sign(a: number, b: number): number {
  return b >= 0 ? Math.abs(a) : -Math.abs(a);
}

function hqr(h: Float64Array, n: number, w: number, wr: Float64Array, wi: Float64Array): void {
  const A = (i: number, j: number): number => h[i * w + j];
  let anorm = 0;
  for (let i = 1; i <= n; i++) for (let j = Math.max(i - 1, 1); j <= n; j++) anorm += Math.abs(A(i, j));
  let nn = n;
  let t = 0;
  let p = 0, q = 0, r = 0, s = 0, x = 0, y = 0, z = 0, ww = 0;
  while (nn >= 1) {
    let its = 0;
    let l: number;
    do {
      for (l = nn; l >= 2; l--) {
        s = Math.abs(A(l - 1, l - 1)) + Math.abs(A(l, l));
        if (s === 0) s = anorm;
        if (Math.abs(A(l, l - 1)) + s === s) { h[l * w + l - 1] = 0; break; }
      }
      x = A(nn, nn);
      if (l === nn) {
        wr[nn] = x + t;
        wi[nn--] = 0;
      } else {
        y = A(nn - 1, nn - 1);
        ww = A(nn, nn - 1) * A(nn - 1, nn);
        if (l === nn - 1) {
          p = 0.5 * (y - x);
          q = p * p + ww;
          z = Math.sqrt(Math.abs(q));
          x += t;
          if (q >= 0) {
            z = p + sign(z, p);
            wr[nn - 1] = wr[nn] = x + z;
            if (z !== 0) wr[nn] = x - ww / z;
            wi[nn - 1] = wi[nn] = 0;
          } else {
            wr[nn - 1] = wr[nn] = x + p;
            wi[nn - 1] = -(wi[nn] = z);
          }
          nn -= 2;
        } else {
          if (its === 60) throw new ControlError('no-convergence', 'eigenvalues: QR iteration did not converge');
          if (its === 10 || its === 20 || its === 40) {
            // exceptional shift (Wilkinson & Reinsch 1971)
            t += x;
            for (let i = 1; i <= nn; i++) h[i * w + i] -= x;
            s = Math.abs(A(nn, nn - 1)) + Math.abs(A(nn - 1, nn - 2));
            y = x = 0.75 * s;
            ww = -0.4375 * s * s;
          }
          ++its;
          let m: number;
          for (m = nn - 2; m >= l; m--) {
            z = A(m, m);
            r = x - z;
            s = y - z;
            p = (r * s - ww) / A(m + 1, m) + A(m, m + 1);
            q = A(m + 1, m + 1) - z - r - s;
            r = A(m + 2, m + 1);
            s = Math.abs(p) + Math.abs(q) + Math.abs(r);
            p /= s; q /= s; r /= s;
            if (m === l) break;
            const u = Math.abs(A(m, m - 1)) * (Math.abs(q) + Math.abs(r));
            const v = Math.abs(p) * (Math.abs(A(m - 1, m - 1)) + Math.abs(z) + Math.abs(A(m + 1, m + 1)));
            if (u + v === v) break;
          }
          for (let i = m + 2; i <= nn; i++) {
            h[i * w + i - 2] = 0;
            if (i !== m + 2) h[i * w + i - 3] = 0;
          }
          for (let k = m; k <= nn - 1; k++) {
            if (k !== m) {
              p = A(k, k - 1);
              q = A(k + 1, k - 1);
              r = 0;
              if (k !== nn - 1) r = A(k + 2, k - 1);
              x = Math.abs(p) + Math.abs(q) + Math.abs(r);
              if (x !== 0) { p /= x; q /= x; r /= x; }
            }
            s = sign(Math.sqrt(p * p + q * q + r * r), p);
            if (s !== 0) {
              if (k === m) {
                if (l !== m) h[k * w + k - 1] = -A(k, k - 1);
              } else h[k * w + k - 1] = -s * x;
              p += s;
              x = p / s;
              y = q / s;
              z = r / s;
              q /= p;
              r /= p;
              for (let j = k; j <= nn; j++) {
                p = A(k, j) + q * A(k + 1, j);
                if (k !== nn - 1) {
                  p += r * A(k + 2, j);
                  h[(k + 2) * w + j] -= p * z;
                }
                h[(k + 1) * w + j] -= p * y;
                h[k * w + j] -= p * x;
              }
              const mmin = nn < k + 3 ? nn : k + 3;
              for (let i = l; i <= mmin; i++) {
                p = x * A(i, k) + y * A(i, k + 1);
                if (k !== nn - 1) {
                  p += z * A(i, k + 2);
                  h[i * w + k + 2] -= p * r;
                }
                h[i * w + k + 1] -= p * q;
                h[i * w + k] -= p;
              }
            }
          }
        }
      }
    } while (l < nn - 1);
  }
}

/**
 * Characteristic polynomial det(zI - A), descending powers, leading coefficient 1.
 *
 * Method: Faddeev-LeVerrier recursion (Gantmacher, "The Theory of Matrices", 1959). Accurate for the
 * small (n <= 4) plant matrices used here; do not use it for large or clustered spectra (use
 * `eigenvalues` instead).
 * @param a - n x n matrix.
 * @returns n + 1 coefficients [1, c1, ..., cn].
 * @example
 * characteristicPolynomial([[2, 0], [0, 3]]); // => [1, -5, 6]
 */
export function characteristicPolynomial(a: Matrix): number[] {
  const n = checkSquare(a, 'characteristicPolynomial');
  const coeffs = [1];
  let m = identity(n).map((r) => r.map(() => 0));
  for (let k = 1; k <= n; k++) {
    // M_k = A M_{k-1} + c_{k-1} I ; c_k = -trace(A M_k)/k
    const am = matMul(a, m);
    for (let i = 0; i < n; i++) am[i][i] += coeffs[k - 1];
    m = am;
    const amk = matMul(a, m);
    let tr = 0;
    for (let i = 0; i < n; i++) tr += amk[i][i];
    coeffs.push(-tr / k);
  }
  return coeffs;
}

/**
 * Checks a SISO state-space model's dimensions.
 * @param sys - the model.
 * @returns the state count n.
 * @throws DimensionError when A is not square or B, C do not match it; MimoNotSupportedError is not thrown here (the type is SISO).
 * @example
 * stateCount({ a: [[0]], b: [1], c: [1], d: 0, timebase: { kind: 'continuous' } }); // => 1
 */
export function stateCount(sys: StateSpace): number {
  const n = checkSquare(sys.a, 'state-space A');
  if (sys.b.length !== n) throw new DimensionError(`state-space: B has ${sys.b.length} rows, A is ${n}x${n}`);
  if (sys.c.length !== n) throw new DimensionError(`state-space: C has ${sys.c.length} columns, A is ${n}x${n}`);
  return n;
}

/**
 * Rejects a matrix input with more than one column, for SISO-only routines.
 * @param b - input matrix, n x m.
 * @returns the single column as a vector.
 * @throws MimoNotSupportedError when m != 1.
 * @example
 * singleColumn([[1], [2]]); // => [1, 2]
 */
export function singleColumn(b: Matrix): number[] {
  for (const row of b) if (row.length !== 1) throw new MimoNotSupportedError(`expected one input column, got ${row.length}`);
  return b.map((r) => r[0]);
}

/**
 * Zero-order-hold discretization of a continuous SISO model.
 *
 * Method: Ad = e^{A Ts}, Bd = (integral_0^Ts e^{A t} dt) B, both from one exponential of the
 * augmented matrix [[A, B], [0, 0]] Ts (Franklin, Powell & Workman, "Digital Control of Dynamic
 * Systems", 1998 [from memory]; Van Loan 1978). C and D are unchanged.
 * @param sys - continuous model (units of its signals, time in s).
 * @param samplePeriodS - sampling period Ts in s (> 0).
 * @returns the discrete model with timebase { kind: 'discrete', samplePeriodS }.
 * @throws ControlError `invalid-argument` for a non-positive period or a discrete input.
 * @example
 * zohStateSpace({ a: [[0]], b: [1], c: [1], d: 0, timebase: { kind: 'continuous' } }, 0.1).b; // => [0.1]
 */
export function zohStateSpace(sys: StateSpace, samplePeriodS: number): StateSpace {
  if (!(samplePeriodS > 0) || !Number.isFinite(samplePeriodS)) throw new ControlError('invalid-argument', 'samplePeriodS must be a finite number > 0');
  if (sys.timebase.kind !== 'continuous') throw new ControlError('invalid-argument', 'zohStateSpace: the model is already discrete');
  const n = stateCount(sys);
  const aug: Matrix = [];
  for (let i = 0; i < n; i++) aug.push([...sys.a[i].map((v) => v * samplePeriodS), sys.b[i] * samplePeriodS]);
  aug.push(new Array<number>(n + 1).fill(0));
  const e = expm(aug);
  return {
    a: e.slice(0, n).map((r) => r.slice(0, n)),
    b: e.slice(0, n).map((r) => r[n]),
    c: sys.c.slice(),
    d: sys.d,
    timebase: { kind: 'discrete', samplePeriodS },
  };
}

/**
 * Impulse-invariant discretization of a continuous SISO model, scaled by Ts so the discrete
 * impulse response equals Ts times samples of the continuous one (the convention of
 * scipy.signal.cont2discrete method 'impulse').
 *
 * Method: Ad = e^{A Ts}, Bd = Ad B Ts, Cd = C, Dd = D + C B Ts (Oppenheim & Schafer,
 * "Discrete-Time Signal Processing", impulse invariance).
 * @param sys - continuous model.
 * @param samplePeriodS - Ts in s (> 0).
 * @returns the discrete model.
 * @throws ControlError `invalid-argument` for a non-positive period or a discrete input.
 * @example
 * impulseInvariantStateSpace({ a: [[0]], b: [1], c: [1], d: 0, timebase: { kind: 'continuous' } }, 0.1).d; // => 0.1
 */
export function impulseInvariantStateSpace(sys: StateSpace, samplePeriodS: number): StateSpace {
  if (!(samplePeriodS > 0) || !Number.isFinite(samplePeriodS)) throw new ControlError('invalid-argument', 'samplePeriodS must be a finite number > 0');
  if (sys.timebase.kind !== 'continuous') throw new ControlError('invalid-argument', 'impulseInvariantStateSpace: the model is already discrete');
  const n = stateCount(sys);
  const ad = expm(sys.a.map((r) => r.map((v) => v * samplePeriodS)));
  const bd = matMul(ad, sys.b.map((v) => [v * samplePeriodS])).map((r) => r[0]);
  let cb = 0;
  for (let i = 0; i < n; i++) cb += sys.c[i] * sys.b[i];
  return { a: ad, b: bd, c: sys.c.slice(), d: sys.d + cb * samplePeriodS, timebase: { kind: 'discrete', samplePeriodS } };
}
