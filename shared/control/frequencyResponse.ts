/**
 * Frequency responses of transfer functions: continuous H(j w) and discrete H(e^{j w Ts}),
 * log-spaced grids and phase unwrapping.
 */
import { ControlError } from './errors';
import { evaluateTf, type TransferFunction } from './transferFunction';

/** Frequency response on a grid: magnitude absolute (not dB) and phase in radians (wrapped to (-pi, pi]). */
export interface FrequencyResponse {
  omegaRadPerS: number[];
  magnitude: number[];
  phaseRad: number[];
}

/**
 * `count` log-spaced values from `start` to `stop` inclusive.
 * @param start - first value (> 0).
 * @param stop - last value (> start).
 * @param count - number of points (>= 2; 1 gives [start], 0 gives []).
 * @returns the grid, ascending.
 * @example
 * logspace(1, 100, 3); // => [1, 10, 100]
 */
export function logspace(start: number, stop: number, count: number): number[] {
  if (!(start > 0) || !(stop > 0)) throw new ControlError('invalid-argument', 'logspace: start and stop must be > 0');
  if (count <= 0) return [];
  if (count === 1) return [start];
  const l0 = Math.log(start);
  const step = (Math.log(stop) - l0) / (count - 1);
  const out = Array.from({ length: count }, (_, i) => Math.exp(l0 + i * step));
  out[count - 1] = stop;
  return out;
}

/**
 * Unwraps a phase sequence in degrees: adds multiples of 360 so consecutive samples differ by at most 180.
 * @param phaseDeg - wrapped phases in degrees.
 * @returns unwrapped phases in degrees (same length).
 * @example
 * unwrapDeg([170, -170]); // => [170, 190]
 */
export function unwrapDeg(phaseDeg: readonly number[]): number[] {
  const out: number[] = [];
  let offset = 0;
  for (let i = 0; i < phaseDeg.length; i++) {
    if (i > 0) {
      const d = phaseDeg[i] + offset - out[i - 1];
      offset -= 360 * Math.round(d / 360);
    }
    out.push(phaseDeg[i] + offset);
  }
  return out;
}

/**
 * Continuous frequency response H(j w) (scipy.signal.freqs equivalent).
 * @param sys - continuous transfer function.
 * @param omegaRadPerS - angular frequencies in rad/s.
 * @returns magnitude (absolute) and phase (rad, wrapped) at each frequency.
 * @throws ControlError `invalid-argument` when sys is discrete.
 * @example
 * freqResponseS(transferFunction([1], [1, 1], { kind: 'continuous' }), [1]).magnitude; // => [0.7071...]
 */
export function freqResponseS(sys: TransferFunction, omegaRadPerS: readonly number[]): FrequencyResponse {
  if (sys.timebase.kind !== 'continuous') throw new ControlError('invalid-argument', 'freqResponseS needs a continuous system');
  return sample(sys, omegaRadPerS, (w) => [0, w]);
}

/**
 * Discrete frequency response H(e^{j w Ts}) (scipy.signal.freqz equivalent, frequencies in rad/s).
 * @param sys - discrete transfer function.
 * @param omegaRadPerS - angular frequencies in rad/s (0 .. pi/Ts).
 * @returns magnitude (absolute) and phase (rad, wrapped) at each frequency.
 * @throws ControlError `invalid-argument` when sys is continuous.
 * @example
 * freqResponseZ(transferFunction([1, 0], [1, -0.5], { kind: 'discrete', samplePeriodS: 1 }), [0]).magnitude; // => [2]
 */
export function freqResponseZ(sys: TransferFunction, omegaRadPerS: readonly number[]): FrequencyResponse {
  if (sys.timebase.kind !== 'discrete') throw new ControlError('invalid-argument', 'freqResponseZ needs a discrete system');
  const Ts = sys.timebase.samplePeriodS;
  return sample(sys, omegaRadPerS, (w) => [Math.cos(w * Ts), Math.sin(w * Ts)]);
}

function sample(sys: TransferFunction, omegaRadPerS: readonly number[], point: (w: number) => [number, number]): FrequencyResponse {
  const magnitude: number[] = [];
  const phaseRad: number[] = [];
  for (const w of omegaRadPerS) {
    const [re, im] = point(w);
    const h = evaluateTf(sys, re, im);
    magnitude.push(Math.hypot(h.re, h.im));
    phaseRad.push(Math.atan2(h.im, h.re));
  }
  return { omegaRadPerS: omegaRadPerS.slice(), magnitude, phaseRad };
}
