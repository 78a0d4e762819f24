/**
 * Limited PI step with anti-windup, bit-exact in fixed point (W = 16 or 32) and in binary32: the
 * DC-link PI (current-reference clamp) and the PLL loop filter (frequency clamp) of the set; the
 * PR limit is a block step with a limit (sections.ts `stepBlock`).
 *
 * Form: parallel PI discretised by Tustin, the same transfer function as the `pi` section of the
 * analysis (CONTRACT section 2): u[n] = kp e[n] + I[n], I[n] = I[n-1] + kh (e[n] + e[n-1]) with
 * kh = ki Ts / 2 (both gains times the block's g, CONTRACT section 7).
 *
 * Anti-windup: clamping, also called conditional integration (Åström & Hägglund, "Advanced PID
 * Control", ISA 2006, section 3.5 on integrator windup; Åström & Rundqwist, "Integrator windup and
 * how to avoid it", ACC 1989). Per sample:
 * ```
 * inc   = kh e + kh e1
 * cand  = I + inc
 * if (kp e + cand > limit and inc > 0) or (kp e + cand < -limit and inc < 0):  I stays   (hold)
 * else I = cand
 * I     = clamp(I, +-limit)                     (the integral alone never exceeds the limit)
 * u     = clamp(kp e + I, +-limit)
 * ```
 * The integrator stops where it would push further into saturation and runs again as soon as the
 * error reverses, so recovery starts at once instead of after the wound-up excess has been
 * integrated away. `antiWindup = 'none'` (for comparison and the tests only) integrates always and
 * only clamps the output; in fixed point its integrator still stops at the signal word's range.
 *
 * Fixed point: e and u are W-bit words; kp and kh are integers with their own fraction bits; the
 * integrator I is a 64-bit integer in units of 2^-G signal LSB (G = `stateGuardBits` of the two
 * gains), so the integral keeps G bits below the signal LSB and never stalls (every product is
 * rounded to 2^-G LSB; the output is rounded once to the signal LSB). Float32: every product and
 * sum rounded to binary32 in the order written above.
 */
import { quantizeOwnScale, qFormatLabel, stateGuardBits } from '../control/index';
import { roundShift } from './deltaModel';
import { FixedArithmeticError, signalMax } from './fixedModel';

/** Anti-windup of the limited PI: conditional integration (the set), or none (for comparison). */
export type AntiWindup = 'conditional-integration' | 'none';

/** Quantized gains of a fixed-point limited PI. */
export interface FixedPiTaps {
  arithmetic: 'fixed';
  wordBits: number;
  /** kp integer and its fraction bits. */
  kp: number;
  kpFracBits: number;
  /** kh = ki Ts / 2 integer and its fraction bits. */
  ki: number;
  kiFracBits: number;
  /** Guard bits of the integrator (units of 2^-G signal LSB). */
  guardBits: number;
  /** Q-format labels of kp and kh. */
  qFormats: [string, string];
}

/** binary32 gains of a single-precision limited PI. */
export interface Float32PiTaps {
  arithmetic: 'float32';
  /** kp (binary32). */
  kp: number;
  /** kh = ki Ts / 2 (binary32). */
  ki: number;
}

/** Gains of a limited PI in either arithmetic. */
export type PiTaps = FixedPiTaps | Float32PiTaps;

/**
 * Quantizes the gains of a limited PI: kp and kh = ki Ts / 2 (already scaled by g) each on its own
 * scale (largest F with the integer within +-(2^(W-1) - 1)), G from `stateGuardBits`.
 *
 * @param kp - proportional gain in the block's signal units.
 * @param kh - ki Ts / 2 in the block's signal units.
 * @param wordBits - W.
 * @returns the taps.
 * @example
 * quantizePiTaps(0.4, 4e-4, 32).guardBits; // => 25
 */
export function quantizePiTaps(kp: number, kh: number, wordBits: number): FixedPiTaps {
  const p = quantizeOwnScale(kp, wordBits);
  const i = quantizeOwnScale(kh, wordBits);
  const nonZero = [p, i].filter((q) => q.code !== 0).map((q) => q.fracBits);
  return {
    arithmetic: 'fixed', wordBits, kp: p.code, kpFracBits: p.fracBits, ki: i.code, kiFracBits: i.fracBits,
    guardBits: stateGuardBits(wordBits, nonZero), qFormats: [qFormatLabel(wordBits, p.fracBits), qFormatLabel(wordBits, i.fracBits)],
  };
}

/** State of a limited PI: the integrator and the previous error. */
export interface PiState {
  readonly taps: PiTaps;
  /** Integrator: bigint in 2^-G signal LSB (fixed), binary32 (float32). */
  integral: bigint | number;
  /** e[n-1]. */
  e1: number;
}

/**
 * Reset state of a limited PI (integrator and previous error zero).
 *
 * @param taps - its gains (fixed taps are checked: integers within the word, F in [0, 62], G >= 0).
 * @returns the state.
 * @example
 * const pll = createPiState(set.pi['pll-pi']);
 */
export function createPiState(taps: PiTaps): PiState {
  if (taps.arithmetic === 'fixed') {
    const max = signalMax(taps.wordBits);
    for (const [code, f] of [[taps.kp, taps.kpFracBits], [taps.ki, taps.kiFracBits]]) {
      if (!Number.isInteger(code) || Math.abs(code) > max || !Number.isInteger(f) || f < 0 || f > 62) {
        throw new FixedArithmeticError('invalid-coefficients', `PI gains must be integers within +-${max} with fraction bits in [0, 62]`);
      }
    }
    if (taps.guardBits < 0) throw new FixedArithmeticError('invalid-coefficients', 'PI gains too large for the word (guard bits < 0)');
    return { taps, integral: 0n, e1: 0 };
  }
  return { taps, integral: 0, e1: 0 };
}

/**
 * Clears the integrator and the previous error.
 *
 * @param state - the state (mutated).
 * @returns nothing.
 * @example
 * resetPiState(pll);
 */
export function resetPiState(state: PiState): void {
  state.integral = state.taps.arithmetic === 'fixed' ? 0n : 0;
  state.e1 = 0;
}

/**
 * One sample of the limited PI (module comment).
 *
 * @param state - the state (mutated).
 * @param error - e[n]: a W-bit integer (fixed) or a binary32 value, in the block's input unit.
 * @param limit - output clamp in the block's output unit: integer in [0, 2^(W-1) - 1] (fixed) or
 *   a positive binary32 value.
 * @param antiWindup - `conditional-integration` (the set) or `none` (comparison only).
 * @returns u[n], clamped to +-limit.
 * @throws FixedArithmeticError for an input or limit outside the word.
 * @example
 * stepPi(pll, qError, frequencyLimit); // => frequency deviation, within +-frequencyLimit
 */
export function stepPi(state: PiState, error: number, limit: number, antiWindup: AntiWindup = 'conditional-integration'): number {
  const taps = state.taps;
  if (taps.arithmetic === 'float32') {
    const f = Math.fround;
    const p = f(taps.kp * error);
    const inc = f(f(taps.ki * error) + f(taps.ki * state.e1));
    const previous = state.integral as number;
    let integral = f(previous + inc);
    if (antiWindup === 'conditional-integration') {
      const candidate = f(p + integral);
      if ((candidate > limit && inc > 0) || (candidate < -limit && inc < 0)) integral = previous;
      if (integral > limit) integral = limit;
      else if (integral < -limit) integral = -limit;
    }
    let u = f(p + integral);
    if (u > limit) u = limit;
    else if (u < -limit) u = -limit;
    state.integral = integral;
    state.e1 = error;
    return u;
  }
  const word = signalMax(taps.wordBits);
  if (!Number.isInteger(error) || Math.abs(error) > word) throw new FixedArithmeticError('invalid-input', `error must be an integer within +-${word}, got ${error}`);
  if (!Number.isInteger(limit) || limit < 0 || limit > word) throw new FixedArithmeticError('invalid-input', `limit must be an integer in [0, ${word}], got ${limit}`);
  const g = taps.guardBits;
  const e = BigInt(error);
  const kp = BigInt(taps.kp);
  const ki = BigInt(taps.ki);
  const p = roundShift(kp * e, taps.kpFracBits - g);
  const inc = roundShift(ki * e, taps.kiFracBits - g) + roundShift(ki * BigInt(state.e1), taps.kiFracBits - g);
  const previous = state.integral as bigint;
  let integral = previous + inc;
  const bound = BigInt(antiWindup === 'conditional-integration' ? limit : word) << BigInt(g);
  if (antiWindup === 'conditional-integration') {
    const candidate = p + integral;
    if ((candidate > bound && inc > 0n) || (candidate < -bound && inc < 0n)) integral = previous;
  }
  if (integral > bound) integral = bound;
  else if (integral < -bound) integral = -bound;
  const raw = roundShift(p + integral, g);
  const lim = BigInt(limit);
  const u = raw > lim ? lim : raw < -lim ? -lim : raw;
  state.integral = integral;
  state.e1 = error;
  return Number(u);
}
