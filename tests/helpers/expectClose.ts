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

/**
 * Pairs a plotted response (recorded every `stride` samples over a longer horizon) with a per-sample
 * reference: keeps the recorded points whose sample index k = t/Ts lies inside the reference.
 */
export function atReferenceSamples(got: { timeS: readonly number[]; value: readonly number[] }, reference: readonly number[], samplePeriodS: number): { got: number[]; want: number[]; indices: number[] } {
  const out = { got: [] as number[], want: [] as number[], indices: [] as number[] };
  got.timeS.forEach((t, i) => {
    const k = Math.round(t / samplePeriodS);
    expect(Math.abs(t / samplePeriodS - k), `time ${t} is not on the sample grid`).toBeLessThan(1e-6);
    if (k < reference.length) { out.got.push(got.value[i]); out.want.push(reference[k]); out.indices.push(k); }
  });
  expect(out.got.length, 'recorded points inside the reference').toBeGreaterThan(1);
  return out;
}
