/**
 * Fourier analysis of recorded waveforms over a window of whole grid cycles.
 *
 * A recorded waveform is a list of (t, y) points, not evenly spaced (integrator substeps, switching
 * instants; a repeated time marks a jump). It is taken as the piecewise-linear function through
 * them, and every integral below is exact for that function, so no sampling-rate aliasing enters
 * the harmonics: over a piece of length tau with midpoint t_m, y = y_m + s (t - t_m),
 * int y e^{-j W t} dt = e^{-j W t_m} [y_m tau sinc(W tau/2) - 2j s (tau/2)^2 g(W tau/2)],
 * sinc(x) = sin x / x, g(x) = (sin x - x cos x) / x^2 (integration by parts).
 */

/** Points of one or more recorded signals: times and the values of each signal, `count` of them used. */
export interface RecordedPoints {
  timeS: ArrayLike<number>;
  count: number;
}

/** Fourier coefficients c_h = (2/T) int y e^{-j h w t} dt over the window (c_0 = mean), h = 0..H. */
export interface FourierCoefficients {
  re: Float64Array;
  im: Float64Array;
}

// Series below this argument: the direct forms lose digits to cancellation.
const SMALL_ARGUMENT = 1e-2;

function sincAndG(x: number, s: number, c: number): [number, number] {
  if (Math.abs(x) < SMALL_ARGUMENT) {
    const x2 = x * x;
    return [1 - x2 / 6 + (x2 * x2) / 120, x * (1 / 3 - x2 / 30 + (x2 * x2) / 840)];
  }
  return [s / x, (s - x * c) / (x * x)];
}

/**
 * Walks the pieces of the piecewise-linear signal inside [startS, endS], clipping the end pieces.
 * @param points - times.
 * @param values - values.
 * @param startS - window start, s.
 * @param endS - window end, s.
 * @param visit - called with (ta, ya, tb, yb) for each piece of positive length.
 */
function forEachPiece(points: RecordedPoints, values: ArrayLike<number>, startS: number, endS: number, visit: (ta: number, ya: number, tb: number, yb: number) => void): void {
  const t = points.timeS;
  for (let i = 1; i < points.count; i++) {
    let ta = t[i - 1];
    let tb = t[i];
    if (tb <= startS || ta >= endS || tb <= ta) continue;
    let ya = values[i - 1];
    let yb = values[i];
    const slope = (yb - ya) / (tb - ta);
    if (ta < startS) { ya += slope * (startS - ta); ta = startS; }
    if (tb > endS) { yb -= slope * (tb - endS); tb = endS; }
    visit(ta, ya, tb, yb);
  }
}

/**
 * Fourier coefficients of a recorded signal over [startS, endS] (a whole number of cycles of
 * `fundamentalHz` for the harmonics to be orthogonal), exact for the piecewise-linear signal.
 *
 * @param points - times, s.
 * @param values - the signal.
 * @param fundamentalHz - f, Hz.
 * @param maxHarmonic - H, highest order.
 * @param startS - window start, s.
 * @param endS - window end, s.
 * @returns c_h for h = 0..H: y(t) ~ c_0 + sum Re(c_h e^{j h w t}); |c_h| is the amplitude of harmonic h.
 * @example
 * // y = 3 sin(w t) sampled finely over one cycle:
 * fourierCoefficients(points, y, 50, 1, 0, 0.02).im[1]; // => -3 (c_1 = -3j: 3 sin = Re(-3j e^{jwt}))
 */
export function fourierCoefficients(points: RecordedPoints, values: ArrayLike<number>, fundamentalHz: number, maxHarmonic: number, startS: number, endS: number): FourierCoefficients {
  const re = new Float64Array(maxHarmonic + 1);
  const im = new Float64Array(maxHarmonic + 1);
  const w = 2 * Math.PI * fundamentalHz;
  forEachPiece(points, values, startS, endS, (ta, ya, tb, yb) => {
    const tau = tb - ta;
    const half = tau / 2;
    const tm = ta + half;
    const ym = (ya + yb) / 2;
    const slope = (yb - ya) / tau;
    re[0] += ym * tau;
    // e^{-j w tm} and e^{j w half}, raised to h by recurrence.
    const er1 = Math.cos(w * tm);
    const ei1 = -Math.sin(w * tm);
    const cr1 = Math.cos(w * half);
    const ci1 = Math.sin(w * half);
    let er = 1, ei = 0, cr = 1, ci = 0;
    for (let h = 1; h <= maxHarmonic; h++) {
      const ner = er * er1 - ei * ei1; ei = er * ei1 + ei * er1; er = ner;
      const ncr = cr * cr1 - ci * ci1; ci = cr * ci1 + ci * cr1; cr = ncr;
      const x = h * w * half;
      const [sinc, g] = sincAndG(x, ci, cr);
      // bracket = ym tau sinc - 2j slope half^2 g
      const br = ym * tau * sinc;
      const bi = -2 * slope * half * half * g;
      re[h] += er * br - ei * bi;
      im[h] += er * bi + ei * br;
    }
  });
  const span = endS - startS;
  re[0] /= span;
  for (let h = 1; h <= maxHarmonic; h++) { re[h] *= 2 / span; im[h] *= 2 / span; }
  return { re, im };
}

/**
 * Mean of the product of two recorded signals over a window, exact for piecewise-linear signals:
 * over a piece, int a b dt = tau (2 a0 b0 + a0 b1 + a1 b0 + 2 a1 b1) / 6.
 *
 * @param points - times, s.
 * @param a - first signal.
 * @param b - second signal (pass `a` for a mean square).
 * @param startS - window start, s.
 * @param endS - window end, s.
 * @returns (1/T) int a b dt.
 * @example
 * meanOfProduct(points, v, i, 0, 0.1); // => average power in W for v in V and i in A
 */
export function meanOfProduct(points: RecordedPoints, a: ArrayLike<number>, b: ArrayLike<number>, startS: number, endS: number): number {
  const t = points.timeS;
  let sum = 0;
  for (let i = 1; i < points.count; i++) {
    let ta = t[i - 1];
    let tb = t[i];
    if (tb <= startS || ta >= endS || tb <= ta) continue;
    let a0 = a[i - 1], a1 = a[i], b0 = b[i - 1], b1 = b[i];
    const sa = (a1 - a0) / (tb - ta);
    const sb = (b1 - b0) / (tb - ta);
    if (ta < startS) { a0 += sa * (startS - ta); b0 += sb * (startS - ta); ta = startS; }
    if (tb > endS) { a1 -= sa * (tb - endS); b1 -= sb * (tb - endS); tb = endS; }
    sum += ((tb - ta) * (2 * a0 * b0 + a0 * b1 + a1 * b0 + 2 * a1 * b1)) / 6;
  }
  return sum / (endS - startS);
}

/**
 * Extremes of a recorded signal over a window (its values at the points inside, and at the clipped ends).
 *
 * @param points - times, s.
 * @param values - the signal.
 * @param startS - window start, s.
 * @param endS - window end, s.
 * @returns `{ min, max }`.
 * @example
 * extremes(points, vdc, 0.4, 0.483); // => { min: 194.1, max: 205.9 }
 */
export function extremes(points: RecordedPoints, values: ArrayLike<number>, startS: number, endS: number): { min: number; max: number } {
  let min = Infinity;
  let max = -Infinity;
  forEachPiece(points, values, startS, endS, (_ta, ya, _tb, yb) => {
    min = Math.min(min, ya, yb);
    max = Math.max(max, ya, yb);
  });
  return { min, max };
}

/**
 * Total harmonic distortion as IEEE Std 519-2014 defines it (clause 3: the rms of the harmonic
 * content up to the 50th order, interharmonics excluded, as a percentage of the fundamental;
 * from memory): THD = 100 sqrt(sum_{h=2}^{50} I_h^2) / I_1.
 *
 * @param amplitudes - |c_h| for h = 0..H (index = order; 0 and 1 as given, H <= 50 used).
 * @returns THD in percent, or null when the fundamental is zero.
 * @example
 * thdPercent([0, 10, 0, 0.3, 0, 0.4]); // => 5 (sqrt(0.09 + 0.16) / 10 = 0.05)
 */
export function thdPercent(amplitudes: ArrayLike<number>): number | null {
  const fundamental = amplitudes[1];
  if (!(fundamental > 0)) return null;
  let sum = 0;
  for (let h = 2; h < Math.min(amplitudes.length, 51); h++) sum += amplitudes[h] * amplitudes[h];
  return (100 * Math.sqrt(sum)) / fundamental;
}
