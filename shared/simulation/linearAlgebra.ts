/**
 * Small dense linear algebra on flat Float64Arrays (row-major), for the per-step solves of the
 * integrator: n is the number of plant states (at most about 12), so a hand-written LU with partial
 * pivoting beats any general library call that allocates per step.
 */

/** An LU factorization with partial pivoting of an n x n matrix, in place. */
export interface LuFactors {
  /** Matrix order. */
  n: number;
  /** L (unit lower, below the diagonal) and U (on and above), row-major, n*n. */
  lu: Float64Array;
  /** Row permutation: row i of the factored matrix is row `pivot[i]` of the original. */
  pivot: Int32Array;
}

/**
 * Allocates the storage of an n x n factorization (reuse it across steps).
 *
 * @param n - matrix order (>= 1).
 * @returns zeroed factors.
 * @example
 * createLuFactors(3).lu.length; // => 9
 */
export function createLuFactors(n: number): LuFactors {
  return { n, lu: new Float64Array(n * n), pivot: new Int32Array(n) };
}

/**
 * LU factorization with partial pivoting, Doolittle form (Golub & Van Loan, "Matrix Computations",
 * 4th ed., 2013, algorithm 3.4.1, from memory): P A = L U.
 *
 * @param a - the matrix, row-major n*n (not modified).
 * @param out - factors to overwrite (from {@link createLuFactors} with the same n).
 * @returns `out`.
 * @throws Error when a pivot is exactly zero (singular matrix).
 * @example
 * const f = luFactor(Float64Array.from([4, 3, 6, 3]), createLuFactors(2));
 * luSolve(f, Float64Array.from([10, 12]), new Float64Array(2)); // => [1, 2]
 */
export function luFactor(a: Float64Array, out: LuFactors): LuFactors {
  const n = out.n;
  const lu = out.lu;
  const pivot = out.pivot;
  lu.set(a.subarray(0, n * n));
  for (let i = 0; i < n; i++) pivot[i] = i;
  for (let k = 0; k < n; k++) {
    let p = k;
    let best = Math.abs(lu[k * n + k]);
    for (let i = k + 1; i < n; i++) {
      const v = Math.abs(lu[i * n + k]);
      if (v > best) { best = v; p = i; }
    }
    if (best === 0) throw new Error('luFactor: singular matrix');
    if (p !== k) {
      for (let j = 0; j < n; j++) {
        const t = lu[k * n + j]; lu[k * n + j] = lu[p * n + j]; lu[p * n + j] = t;
      }
      const t = pivot[k]; pivot[k] = pivot[p]; pivot[p] = t;
    }
    const d = lu[k * n + k];
    for (let i = k + 1; i < n; i++) {
      const f = lu[i * n + k] / d;
      lu[i * n + k] = f;
      if (f !== 0) for (let j = k + 1; j < n; j++) lu[i * n + j] -= f * lu[k * n + j];
    }
  }
  return out;
}

/**
 * Solves A x = b from the factors of {@link luFactor} (forward then back substitution).
 *
 * @param f - factors of A.
 * @param b - right-hand side, length n (not modified).
 * @param x - solution output, length n (may not alias b).
 * @returns `x`.
 * @example
 * luSolve(luFactor(Float64Array.from([2, 0, 0, 4]), createLuFactors(2)), Float64Array.from([2, 8]), new Float64Array(2)); // => [1, 2]
 */
export function luSolve(f: LuFactors, b: Float64Array, x: Float64Array): Float64Array {
  const n = f.n;
  const lu = f.lu;
  for (let i = 0; i < n; i++) {
    let s = b[f.pivot[i]];
    for (let j = 0; j < i; j++) s -= lu[i * n + j] * x[j];
    x[i] = s;
  }
  for (let i = n - 1; i >= 0; i--) {
    let s = x[i];
    for (let j = i + 1; j < n; j++) s -= lu[i * n + j] * x[j];
    x[i] = s / lu[i * n + i];
  }
  return x;
}
