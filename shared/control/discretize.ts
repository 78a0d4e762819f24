/**
 * Discretization of continuous SISO transfer functions: Tustin, Tustin prewarped, forward and
 * backward Euler, zero-order hold, impulse invariance; and where a resonator's resonance lands
 * under each method.
 *
 * Input and output transfer functions are in descending powers (of s, resp. z); the discrete
 * result has den[0] = 1 and num padded to den's length, so it reads equally in powers of z^-1.
 */
import { ControlError } from './errors';
import { polyMul } from './polynomial';
import { resonanceHzFromDenominator } from './resonance';
import { impulseInvariantStateSpace, zohStateSpace } from './stateSpace';
import { ssToTf, tfToSs, transferFunction, type TransferFunction } from './transferFunction';

function checkPeriod(samplePeriodS: number): void {
  if (!(samplePeriodS > 0) || !Number.isFinite(samplePeriodS)) throw new ControlError('invalid-argument', 'samplePeriodS must be a finite number > 0');
}

function checkContinuous(sys: TransferFunction): void {
  if (sys.timebase.kind !== 'continuous') throw new ControlError('invalid-argument', 'discretization needs a continuous-time system');
}

function polyPow(p: readonly number[], k: number): number[] {
  let out = [1];
  for (let i = 0; i < k; i++) out = polyMul(out, p);
  return out;
}

// Substitutes s = (alpha z + beta)/(gamma z + delta) into p(s)/q(s), both multiplied by (gamma z + delta)^n.
function substituteMobius(sys: TransferFunction, alpha: number, beta: number, gamma: number, delta: number, samplePeriodS: number): TransferFunction {
  const n = sys.den.length - 1;
  const map = (p: readonly number[]): number[] => {
    let acc = new Array<number>(n + 1).fill(0);
    p.forEach((coefficient, i) => {
      // p[i] multiplies s^(n-i) -> (alpha z + beta)^(n-i) (gamma z + delta)^i
      const term = polyMul(polyPow([alpha, beta], n - i), polyPow([gamma, delta], i)).map((v) => v * coefficient);
      const padded = new Array<number>(n + 1 - term.length).fill(0).concat(term);
      acc = acc.map((v, j) => v + padded[j]);
    });
    return acc;
  };
  const num = map(sys.num);
  const den = map(sys.den);
  const lead = den[0];
  if (lead === 0 || !Number.isFinite(lead)) throw new ControlError('invalid-argument', 'discretization: the discrete denominator lost its leading term (pole mapped to infinity)');
  return transferFunction(num.map((v) => v / lead), den.map((v) => v / lead), { kind: 'discrete', samplePeriodS });
}

/**
 * Tustin (bilinear) discretization, s = (2/Ts)(z - 1)/(z + 1) (Oppenheim & Schafer, "Discrete-Time Signal Processing", bilinear transform).
 * @param sys - continuous, proper transfer function (s in rad/s).
 * @param samplePeriodS - Ts in s (> 0).
 * @returns the discrete transfer function, den[0] = 1.
 * @example
 * tustin(transferFunction([1], [1, 0], { kind: 'continuous' }), 0.1).num; // => [0.05, 0.05]  (den [1, -1])
 */
export function tustin(sys: TransferFunction, samplePeriodS: number): TransferFunction {
  checkPeriod(samplePeriodS);
  checkContinuous(sys);
  const c = 2 / samplePeriodS;
  return substituteMobius(sys, c, -c, 1, 1, samplePeriodS);
}

/**
 * Tustin prewarped at wp: s = (wp / tan(wp Ts / 2)) (z - 1)/(z + 1), so the discrete response at
 * e^{j wp Ts} equals the continuous one at j wp (Oppenheim & Schafer, bilinear transform with frequency prewarping).
 * @param sys - continuous, proper transfer function.
 * @param samplePeriodS - Ts in s (> 0).
 * @param prewarpRadPerS - wp in rad/s, 0 < wp < pi/Ts (0 falls back to plain Tustin).
 * @returns the discrete transfer function, den[0] = 1.
 * @throws ControlError `invalid-argument` when wp is negative or not below the Nyquist frequency.
 * @example
 * // ideal resonator s/(s^2 + w0^2), 50 Hz at 20 kHz: den [1, -1.999753264963321, 1]
 * tustinPrewarp(transferFunction([1, 0], [1, 0, (2*Math.PI*50)**2], { kind: 'continuous' }), 5e-5, 2*Math.PI*50);
 */
export function tustinPrewarp(sys: TransferFunction, samplePeriodS: number, prewarpRadPerS: number): TransferFunction {
  checkPeriod(samplePeriodS);
  checkContinuous(sys);
  if (prewarpRadPerS === 0) return tustin(sys, samplePeriodS);
  if (!(prewarpRadPerS > 0) || prewarpRadPerS * samplePeriodS >= Math.PI) {
    throw new ControlError('invalid-argument', `prewarpRadPerS must be > 0 and below pi/Ts = ${Math.PI / samplePeriodS} rad/s`);
  }
  const c = prewarpRadPerS / Math.tan((prewarpRadPerS * samplePeriodS) / 2);
  return substituteMobius(sys, c, -c, 1, 1, samplePeriodS);
}

/**
 * Forward Euler (explicit rectangle rule), s = (z - 1)/Ts (Franklin, Powell & Workman 1998 [from memory]).
 * @param sys - continuous, proper transfer function.
 * @param samplePeriodS - Ts in s (> 0).
 * @returns the discrete transfer function, den[0] = 1.
 * @example
 * forwardEuler(transferFunction([1], [1, 1], { kind: 'continuous' }), 0.1).den; // => [1, -0.9]
 */
export function forwardEuler(sys: TransferFunction, samplePeriodS: number): TransferFunction {
  checkPeriod(samplePeriodS);
  checkContinuous(sys);
  return substituteMobius(sys, 1, -1, 0, samplePeriodS, samplePeriodS);
}

/**
 * Backward Euler (implicit rectangle rule), s = (z - 1)/(z Ts) (Franklin, Powell & Workman 1998 [from memory]).
 * @param sys - continuous, proper transfer function.
 * @param samplePeriodS - Ts in s (> 0).
 * @returns the discrete transfer function, den[0] = 1.
 * @example
 * backwardEuler(transferFunction([1], [1, 1], { kind: 'continuous' }), 0.1).den; // => [1, -0.909090...]
 */
export function backwardEuler(sys: TransferFunction, samplePeriodS: number): TransferFunction {
  checkPeriod(samplePeriodS);
  checkContinuous(sys);
  return substituteMobius(sys, 1, -1, samplePeriodS, 0, samplePeriodS);
}

/**
 * Zero-order-hold discretization G(z) = (1 - z^-1) Z{G(s)/s}, through a state-space realization
 * and the augmented matrix exponential (Franklin, Powell & Workman 1998 [from memory]).
 * Suited to low-order plants (n <= 4).
 * @param sys - continuous, proper transfer function.
 * @param samplePeriodS - Ts in s (> 0).
 * @returns the discrete transfer function, den[0] = 1.
 * @example
 * zoh(transferFunction([1], [1, 0], { kind: 'continuous' }), 0.1); // => 0.1 / (z - 1)
 */
export function zoh(sys: TransferFunction, samplePeriodS: number): TransferFunction {
  checkPeriod(samplePeriodS);
  checkContinuous(sys);
  return ssToTf(zohStateSpace(tfToSs(sys), samplePeriodS));
}

/**
 * Impulse-invariant discretization with the Ts scaling of scipy.signal.cont2discrete method
 * 'impulse' (Oppenheim & Schafer, impulse invariance): poles map to e^{p Ts}.
 * @param sys - continuous, proper transfer function.
 * @param samplePeriodS - Ts in s (> 0).
 * @returns the discrete transfer function, den[0] = 1.
 * @example
 * impulseInvariant(transferFunction([1], [1, 1], { kind: 'continuous' }), 0.1).den; // => [1, -0.904837...]
 */
export function impulseInvariant(sys: TransferFunction, samplePeriodS: number): TransferFunction {
  checkPeriod(samplePeriodS);
  checkContinuous(sys);
  return ssToTf(impulseInvariantStateSpace(tfToSs(sys), samplePeriodS));
}

/** The method keys of {@link resonanceByMethodHz}, in display order. */
export const RESONANCE_METHODS = ['tustin-prewarp', 'tustin', 'forward-euler', 'backward-euler', 'zoh', 'impulse-invariant'] as const;

/**
 * Where the resonance of R(s) = 2 kr wb s / (s^2 + 2 wb s + w^2) (or kr s / (s^2 + w^2) when
 * wb = 0) lands under each discretization method, in Hz, from resonanceHzFromDenominator of the
 * discretized denominator (Yepes et al., "Effects of discretization methods on the performance of
 * resonant controllers", IEEE TPEL 2010). The gain kr does not move the resonance.
 *
 * ZOH and impulse invariance share the pole map z = e^{p Ts}, hence the same denominator.
 * @param resonanceRadPerS - w in rad/s (> 0, below pi/Ts).
 * @param bandwidthRadPerS - wb in rad/s (>= 0).
 * @param samplePeriodS - Ts in s (> 0).
 * @returns keys 'tustin-prewarp', 'tustin', 'forward-euler', 'backward-euler', 'zoh',
 *   'impulse-invariant'; a value is null where the denominator has no real centre frequency.
 * @throws ControlError `invalid-argument` for non-positive or non-finite arguments.
 * @example
 * resonanceByMethodHz(2 * Math.PI * 50, 0, 5e-5)['tustin-prewarp']; // => 50 (to rounding)
 */
export function resonanceByMethodHz(resonanceRadPerS: number, bandwidthRadPerS: number, samplePeriodS: number): Record<string, number | null> {
  checkPeriod(samplePeriodS);
  if (!(resonanceRadPerS > 0) || !Number.isFinite(resonanceRadPerS) || resonanceRadPerS * samplePeriodS >= Math.PI) {
    throw new ControlError('invalid-argument', 'resonanceRadPerS must be > 0 and below pi/Ts');
  }
  if (!(bandwidthRadPerS >= 0) || !Number.isFinite(bandwidthRadPerS)) throw new ControlError('invalid-argument', 'bandwidthRadPerS must be a finite number >= 0');
  const w = resonanceRadPerS;
  const wb = bandwidthRadPerS;
  const Ts = samplePeriodS;
  const normalize = (z2: number, z1: number, z0: number): number[] => [1, z1 / z2, z0 / z2];
  const bilinearDen = (c: number): number[] => normalize(c * c + 2 * wb * c + w * w, 2 * w * w - 2 * c * c, c * c - 2 * wb * c + w * w);
  const cPrewarp = w / Math.tan((w * Ts) / 2);
  // forward Euler: (z-1)^2 + 2 wb Ts (z-1) + w^2 Ts^2
  const forward = normalize(1, -2 + 2 * wb * Ts, 1 - 2 * wb * Ts + w * w * Ts * Ts);
  // backward Euler: (1 - z^-1)^2 + 2 wb Ts (1 - z^-1) + w^2 Ts^2, in powers of z^-1
  const backward = normalize(1 + 2 * wb * Ts + w * w * Ts * Ts, -2 - 2 * wb * Ts, 1);
  // ZOH / impulse invariance: poles e^{p Ts}, p = -wb +- sqrt(wb^2 - w^2)
  let zohDen: number[];
  const disc = wb * wb - w * w;
  if (disc < 0) {
    const r = Math.exp(-wb * Ts);
    zohDen = [1, -2 * r * Math.cos(Math.sqrt(-disc) * Ts), r * r];
  } else {
    const p1 = Math.exp((-wb + Math.sqrt(disc)) * Ts);
    const p2 = Math.exp((-wb - Math.sqrt(disc)) * Ts);
    zohDen = [1, -(p1 + p2), p1 * p2];
  }
  const zohHz = resonanceHzFromDenominator(zohDen, Ts);
  return {
    'tustin-prewarp': resonanceHzFromDenominator(bilinearDen(cPrewarp), Ts),
    tustin: resonanceHzFromDenominator(bilinearDen(2 / Ts), Ts),
    'forward-euler': resonanceHzFromDenominator(forward, Ts),
    'backward-euler': resonanceHzFromDenominator(backward, Ts),
    zoh: zohHz,
    'impulse-invariant': zohHz,
  };
}
