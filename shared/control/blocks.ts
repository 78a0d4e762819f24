/**
 * Discrete second-order sections of every controller block (CONTRACT section 2 forms).
 * Coefficients in powers of z^-1, three entries each, a[0] = 1.
 */

import { bilinearBiquadDelta, type DeltaTaps } from './deltaOperator';

/** Numerator and denominator of one section, powers of z^-1. */
export interface SectionPair {
  b: [number, number, number];
  a: [number, number, number];
  /** The same section in the delta-operator form [b0, d1, d2, c1, c2], computed without cancellation (resonators, SOGI, low-passes). */
  delta?: DeltaTaps;
}

/**
 * Tustin constant prewarped at a frequency: s = K (z-1)/(z+1) with K = wp / tan(wp*Ts/2).
 *
 * Method: frequency prewarping of the bilinear transform (Oppenheim & Schafer, "Discrete-Time
 * Signal Processing", bilinear transformation section) — the discrete response equals the
 * continuous one exactly at wp.
 *
 * @param prewarpRadPerS - wp, rad/s, 0 < wp < pi/Ts.
 * @param samplePeriodS - Ts, s.
 * @returns K in 1/s.
 * @example
 * prewarpedTustinConstant(2 * Math.PI * 50, 5e-5); // => 39999.18...
 */
export function prewarpedTustinConstant(prewarpRadPerS: number, samplePeriodS: number): number {
  return prewarpRadPerS / Math.tan((prewarpRadPerS * samplePeriodS) / 2);
}

/**
 * Maps a continuous biquad (n2 s^2 + n1 s + n0)/(d2 s^2 + d1 s + d0) through s = K (z-1)/(z+1).
 *
 * Method: multiply by (z+1)^2 and collect powers (Oppenheim & Schafer, bilinear transformation).
 *
 * @param num - [n2, n1, n0], descending powers of s.
 * @param den - [d2, d1, d0], descending powers of s (not all zero).
 * @param tustinConstant - K in 1/s (2/Ts plain, wp/tan(wp Ts/2) prewarped).
 * @returns the section normalised to a[0] = 1.
 * @example
 * bilinearBiquad([0, 0, 1], [0, 1, 1], 2); // => { b: [1/3, 1/3, 0], a: [1, -1/3, 0] }
 */
export function bilinearBiquad(num: readonly [number, number, number], den: readonly [number, number, number], tustinConstant: number): SectionPair {
  const k = tustinConstant;
  const k2 = k * k;
  const map = (p: readonly [number, number, number]): [number, number, number] => [
    p[0] * k2 + p[1] * k + p[2],
    -2 * p[0] * k2 + 2 * p[2],
    p[0] * k2 - p[1] * k + p[2],
  ];
  const n = map(num);
  const d = map(den);
  const lead = d[0];
  let b: [number, number, number] = [n[0] / lead, n[1] / lead, n[2] / lead];
  let a: [number, number, number] = [1, d[1] / lead, d[2] / lead];
  // A first-order pair maps to (z+1)·(first order): drop the common root at z = -1 so it stays first order.
  if (num[0] === 0 && den[0] === 0) {
    b = [(num[1] * k + num[2]) / (den[1] * k + den[2]), (-num[1] * k + num[2]) / (den[1] * k + den[2]), 0];
    a = [1, (-den[1] * k + den[2]) / (den[1] * k + den[2]), 0];
  }
  return { b, a };
}

/**
 * PI by plain Tustin: C(s) = kp + ki/s.
 *
 * Method: s = (2/Ts)(z-1)/(z+1) gives b0 = kp + ki Ts/2, b1 = -kp + ki Ts/2, a1 = -1
 * (CONTRACT section 2; Franklin, Powell & Workman, "Digital Control of Dynamic Systems", 1998, from memory).
 *
 * @param kp - proportional gain.
 * @param ki - integral gain, per second.
 * @param samplePeriodS - Ts, s.
 * @returns the section.
 * @example
 * piTustin(1, 100, 1e-4); // => { b: [1.005, -0.995, 0], a: [1, -1, 0] }
 */
export function piTustin(kp: number, ki: number, samplePeriodS: number): SectionPair {
  const half = (ki * samplePeriodS) / 2;
  return { b: [kp + half, -kp + half, 0], a: [1, -1, 0] };
}

/**
 * Resonator, Tustin prewarped at its own frequency.
 *
 * Forms (CONTRACT section 2; Teodorescu et al., IEE Proc. EPA 153(5), 2006; Yepes et al., IEEE TPEL 25(7), 2010):
 * damped R(s) = 2 kr wb s / (s^2 + 2 wb s + wh^2) (gain kr at wh), ideal R(s) = kr s / (s^2 + wh^2).
 *
 * @param gain - kr.
 * @param resonanceRadPerS - wh = h*w0, rad/s.
 * @param bandwidthRadPerS - wb, rad/s (0 = ideal).
 * @param samplePeriodS - Ts, s.
 * @returns the section (band-pass: b1 = 0, b2 = -b0), with its delta-operator form.
 * @example
 * resonatorPrewarped(1, 2 * Math.PI * 50, 0, 5e-5); // => b0 = 2.4998972e-5, a1 = -1.99975326, a2 = 1
 */
export function resonatorPrewarped(gain: number, resonanceRadPerS: number, bandwidthRadPerS: number, samplePeriodS: number): SectionPair {
  const k = prewarpedTustinConstant(resonanceRadPerS, samplePeriodS);
  const w2 = resonanceRadPerS * resonanceRadPerS;
  const num: [number, number, number] = bandwidthRadPerS > 0 ? [0, 2 * gain * bandwidthRadPerS, 0] : [0, gain, 0];
  const den: [number, number, number] = [1, 2 * bandwidthRadPerS, w2];
  const section = bilinearBiquad(num, den, k);
  if (bandwidthRadPerS === 0) section.a[2] = 1; // exactly marginal: (K^2 + w^2)/(K^2 + w^2)
  return { ...section, delta: bilinearBiquadDelta(num, den, k) };
}

/**
 * SOGI band-pass D(s) = k w0 s / (s^2 + k w0 s + w0^2) and low-pass Q(s) = k w0^2 / (same), prewarped at w0.
 *
 * Method: Ciobotaru, Teodorescu & Blaabjerg, PESC 2006 (structure); Tustin prewarped at w0.
 *
 * @param sogiGain - k (dimensionless).
 * @param gridRadPerS - w0, rad/s.
 * @param samplePeriodS - Ts, s.
 * @returns `{ d, q }` sections sharing one denominator, each with its delta-operator form.
 * @example
 * sogiPrewarped(Math.SQRT2, 2 * Math.PI * 50, 1e-4).d.b[0]; // => 0.021728161744398
 */
export function sogiPrewarped(sogiGain: number, gridRadPerS: number, samplePeriodS: number): { d: SectionPair; q: SectionPair } {
  const k = prewarpedTustinConstant(gridRadPerS, samplePeriodS);
  const den: [number, number, number] = [1, sogiGain * gridRadPerS, gridRadPerS * gridRadPerS];
  const numD: [number, number, number] = [0, sogiGain * gridRadPerS, 0];
  const numQ: [number, number, number] = [0, 0, sogiGain * gridRadPerS * gridRadPerS];
  return {
    d: { ...bilinearBiquad(numD, den, k), delta: bilinearBiquadDelta(numD, den, k) },
    q: { ...bilinearBiquad(numQ, den, k), delta: bilinearBiquadDelta(numQ, den, k) },
  };
}

/**
 * Unity-DC-gain low-pass, Tustin prewarped at its cutoff.
 *
 * Forms (CONTRACT section 2): order 1 wc/(s + wc); order 2 Butterworth wc^2/(s^2 + sqrt(2) wc s + wc^2)
 * (Oppenheim & Schafer, Butterworth design by bilinear transformation).
 *
 * @param order - 1 or 2.
 * @param cutoffRadPerS - wc, rad/s.
 * @param samplePeriodS - Ts, s.
 * @returns the section (order 1 padded with zeros), with its delta-operator form.
 * @example
 * lowPassPrewarped(1, 2 * Math.PI * 10, 5e-5); // => b0 = b1 = 1.568334083e-3, a1 = -0.996863331833
 */
export function lowPassPrewarped(order: 1 | 2, cutoffRadPerS: number, samplePeriodS: number): SectionPair {
  const k = prewarpedTustinConstant(cutoffRadPerS, samplePeriodS);
  const w2 = cutoffRadPerS * cutoffRadPerS;
  const num: [number, number, number] = order === 1 ? [0, 0, cutoffRadPerS] : [0, 0, w2];
  const den: [number, number, number] = order === 1 ? [0, 1, cutoffRadPerS] : [1, Math.SQRT2 * cutoffRadPerS, w2];
  return { ...bilinearBiquad(num, den, k), delta: bilinearBiquadDelta(num, den, k) };
}

/**
 * Frequency response of one section at a frequency.
 *
 * @param section - b and a in powers of z^-1.
 * @param frequencyHz - f, Hz.
 * @param samplePeriodS - Ts, s.
 * @returns `{ re, im }` of H(e^{j 2 pi f Ts}).
 * @example
 * sectionResponse({ b: [1, 0, 0], a: [1, 0, 0] }, 50, 1e-4); // => { re: 1, im: 0 }
 */
export function sectionResponse(section: { b: readonly number[]; a: readonly number[] }, frequencyHz: number, samplePeriodS: number): { re: number; im: number } {
  const theta = 2 * Math.PI * frequencyHz * samplePeriodS;
  const c1 = Math.cos(theta);
  const s1 = Math.sin(theta);
  const c2 = Math.cos(2 * theta);
  const s2 = Math.sin(2 * theta);
  const nr = section.b[0] + section.b[1] * c1 + section.b[2] * c2;
  const ni = -(section.b[1] * s1 + section.b[2] * s2);
  const dr = section.a[0] + section.a[1] * c1 + section.a[2] * c2;
  const di = -(section.a[1] * s1 + section.a[2] * s2);
  const m = dr * dr + di * di;
  return { re: (nr * dr + ni * di) / m, im: (ni * dr - nr * di) / m };
}

/**
 * Unit-step response of one section, sample by sample: y[n] = b0 u[n] + b1 u[n-1] + b2 u[n-2]
 * - a1 y[n-1] - a2 y[n-2] with u = 1 from n = 0 (Direct Form I, a0 = 1; Oppenheim & Schafer,
 * "Discrete-Time Signal Processing", 3rd ed., 2010, sec. 6.3).
 *
 * @param section - b and a in powers of z^-1 (a[0] = 1).
 * @param sampleCount - how many samples at most (n = 0 … sampleCount - 1).
 * @param visit - called with the sample index and y[n]; returning `false` stops the run.
 * @returns the number of samples visited.
 * @example
 * const ys: number[] = [];
 * forEachStepSample({ b: [0.5, 0, 0], a: [1, -0.5, 0] }, 3, (_, y) => { ys.push(y); }); // => 3, ys = [0.5, 0.75, 0.875]
 */
export function forEachStepSample(section: { b: readonly number[]; a: readonly number[] }, sampleCount: number, visit: (index: number, value: number) => boolean | void): number {
  const [b0, b1, b2] = section.b;
  const a1 = section.a[1];
  const a2 = section.a[2];
  let x1 = 0, x2 = 0, y1 = 0, y2 = 0;
  for (let i = 0; i < sampleCount; i++) {
    const y = b0 + b1 * x1 + b2 * x2 - a1 * y1 - a2 * y2;
    if (visit(i, y) === false) return i + 1;
    x2 = x1; x1 = 1; y2 = y1; y1 = y;
  }
  return sampleCount;
}
