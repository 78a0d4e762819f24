import { expect } from 'vitest';

/** Tolerances of a numeric comparison: |actual - expected| <= atol + rtol * |expected|. */
export interface Tolerance {
  rtol?: number;
  atol?: number;
}

/**
 * The one way tests compare computed floats (STYLE habit 9): element-wise for arrays,
 * with the tolerance written at the call site.
 */
export function expectClose(actual: number | readonly number[], expected: number | readonly number[], tol: Tolerance, label = ''): void {
  const a = typeof actual === 'number' ? [actual] : actual;
  const e = typeof expected === 'number' ? [expected] : expected;
  expect(a.length, `${label} length`).toBe(e.length);
  const rtol = tol.rtol ?? 0;
  const atol = tol.atol ?? 0;
  e.forEach((want, i) => {
    const got = a[i];
    const bound = atol + rtol * Math.abs(want);
    const ok = Number.isFinite(got) && Math.abs(got - want) <= bound;
    expect(ok, `${label}[${i}]: got ${got}, expected ${want} (bound ${bound})`).toBe(true);
  });
}

/** Sorts complex numbers [re, im] by real part then imaginary part, for comparing root multisets. */
export function sortComplex(values: readonly (readonly [number, number])[]): [number, number][] {
  return values.map((v) => [v[0], v[1]] as [number, number]).sort((p, q) => p[0] - q[0] || p[1] - q[1]);
}
