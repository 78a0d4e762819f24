/**
 * Time responses of sampled loops: a controller made of parallel second-order sections, a delay
 * of d samples and a discrete state-space plant, closed by negative unity feedback.
 * Plain Float64 loops (no allocation per sample).
 */
import type { SectionCoefficients } from './loops';
import type { StateSpace } from './stateSpace';

/** Signals applied to a closed sampled loop, each a constant step from sample 0. */
export interface LoopExcitation {
  /** Reference step r (units of the plant output). */
  reference: number;
  /** Step added at the plant input (units of the plant input). */
  inputDisturbance: number;
}

/** What to record from the closed loop. */
export type LoopSignal = 'output' | 'error';

/**
 * Simulates e = r - y, u = sum_k C_k(z) e, u delayed by d samples, x[n+1] = A x[n] + B (u_d[n] + w),
 * y[n] = C x[n] + D (u_d[n] + w).
 *
 * Each section runs in Direct Form II transposed (Oppenheim & Schafer, "Discrete-Time Signal
 * Processing", structures for IIR systems), which has the same transfer function as Direct Form I.
 * @param sections - parallel controller sections (a[0] = 1).
 * @param delaySamples - computation delay d >= 0 (integer).
 * @param plant - discrete plant (D = 0 when d = 0 avoids an algebraic loop; a D term is applied from the delayed input).
 * @param excitation - reference and plant-input steps.
 * @param samples - number of samples N.
 * @param record - `output` records y[n], `error` records r - y[n].
 * @returns the recorded signal, N values (may contain non-finite values if the loop diverges).
 * @example
 * // P control kp = 0.5 of y[n+1] = y[n] + u[n]: y = 0, 0.5, 0.75, ...
 * simulateLoop([{ b: [0.5, 0, 0], a: [1, 0, 0] }], 0, { a: [[1]], b: [1], c: [1], d: 0, timebase: { kind: 'discrete', samplePeriodS: 1 } }, { reference: 1, inputDisturbance: 0 }, 3, 'output');
 */
export function simulateLoop(
  sections: readonly SectionCoefficients[],
  delaySamples: number,
  plant: StateSpace,
  excitation: LoopExcitation,
  samples: number,
  record: LoopSignal,
): Float64Array {
  const m = sections.length;
  const b0 = new Float64Array(m), b1 = new Float64Array(m), b2 = new Float64Array(m);
  const a1 = new Float64Array(m), a2 = new Float64Array(m);
  const s1 = new Float64Array(m), s2 = new Float64Array(m);
  sections.forEach((s, k) => {
    b0[k] = s.b[0] ?? 0; b1[k] = s.b[1] ?? 0; b2[k] = s.b[2] ?? 0;
    a1[k] = s.a[1] ?? 0; a2[k] = s.a[2] ?? 0;
  });
  const n = plant.a.length;
  const A = new Float64Array(n * n);
  for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) A[i * n + j] = plant.a[i][j];
  const B = Float64Array.from(plant.b);
  const C = Float64Array.from(plant.c);
  const D = plant.d;
  let x = new Float64Array(n);
  let xn = new Float64Array(n);
  const line = new Float64Array(Math.max(1, delaySamples));
  let head = 0;
  const out = new Float64Array(samples);
  const r = excitation.reference;
  const w = excitation.inputDisturbance;
  for (let t = 0; t < samples; t++) {
    let u = 0;
    let uDelayed = 0;
    let y = 0;
    for (let i = 0; i < n; i++) y += C[i] * x[i];
    if (delaySamples === 0) {
      // y depends on u only through D; D = 0 for the zero-order-hold plants used here
      const e = r - y;
      for (let k = 0; k < m; k++) {
        const v = b0[k] * e + s1[k];
        s1[k] = b1[k] * e - a1[k] * v + s2[k];
        s2[k] = b2[k] * e - a2[k] * v;
        u += v;
      }
      uDelayed = u;
      y += D * (uDelayed + w);
      out[t] = record === 'output' ? y : r - y;
    } else {
      uDelayed = line[head];
      y += D * (uDelayed + w);
      const e = r - y;
      for (let k = 0; k < m; k++) {
        const v = b0[k] * e + s1[k];
        s1[k] = b1[k] * e - a1[k] * v + s2[k];
        s2[k] = b2[k] * e - a2[k] * v;
        u += v;
      }
      line[head] = u;
      head = (head + 1) % delaySamples;
      out[t] = record === 'output' ? y : e;
    }
    const input = uDelayed + w;
    for (let i = 0; i < n; i++) {
      let s = B[i] * input;
      for (let j = 0; j < n; j++) s += A[i * n + j] * x[j];
      xn[i] = s;
    }
    const tmp = x; x = xn; xn = tmp;
  }
  return out;
}
