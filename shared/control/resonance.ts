/**
 * Centre frequency of a second-order section from its denominator [1, a1, a2].
 *
 * Method: a band-pass section [b0, 0, -b0] / [1, a1, a2] has zero phase where
 * cos(omega*Ts) = -a1 / (1 + a2) (CONTRACT section 3; Oppenheim & Schafer, "Discrete-Time Signal
 * Processing", bilinear transform chapter). For Tustin prewarped at omega0 this is exactly omega0.
 *
 * @param a - denominator in powers of z^-1, [1, a1, a2] (dimensionless).
 * @param samplePeriodS - sampling period Ts in seconds (> 0).
 * @returns the centre frequency in Hz, or null when -a1/(1+a2) lies outside [-1, 1] or 1 + a2 = 0
 *   (no real centre frequency: real poles or a degenerate section).
 * @example
 * // ideal resonator at 50 Hz, 20 kHz, prewarped Tustin: a1 = -2 cos(2*pi*50/20000), a2 = 1
 * resonanceHzFromDenominator([1, -1.999753264963321, 1], 5e-5); // => 50.000000000...
 */
export function resonanceHzFromDenominator(a: readonly number[], samplePeriodS: number): number | null {
  const a1 = a[1] ?? 0;
  const a2 = a[2] ?? 0;
  const denominator = 1 + a2;
  if (denominator === 0 || !Number.isFinite(a1) || !Number.isFinite(a2)) return null;
  const cosine = -a1 / denominator;
  if (cosine < -1 || cosine > 1) return null;
  return Math.acos(cosine) / (2 * Math.PI * samplePeriodS);
}
