/**
 * Single-precision (IEEE 754 binary32) arithmetic of the exported set (`fixedPoint.arithmetic =
 * "float32"`, CONTRACT section 7): the coefficients rounded to binary32, the per-sample kernels of
 * both section forms with every operation rounded in the order the generated C performs it, and
 * what single precision does to each section (resonance drift, DC gain, stalling of slow low-passes).
 *
 * Bit-exactness. `Math.fround(a op b)` of two binary32 values, with op in + - *, is the correctly
 * rounded binary32 result: the binary64 result rounded again to binary32 is innocuous because
 * 53 >= 2 * 24 + 2 (Figueroa, "When is double rounding innocuous?", ACM SIGNUM Newsletter 30(3),
 * 1995, from memory). The C code reproduces it when every float expression is evaluated in float
 * (FLT_EVAL_METHOD == 0, C99 5.2.4.2.2) and no multiply-add is fused (`-ffp-contract=off`).
 */
import {
  joinRemedies, keepWorstSogi, LOW_PASS_DC_GAIN_TOLERANCE, maxPoleRadius, resonanceDriftCheck, ROBUST_STRUCTURE_REMEDY,
} from './fixedPoint';
import { sectionName } from './names';
import { resonanceHzFromDenominator } from './resonance';
import { deltaResonanceHz } from './deltaOperator';
import type { BlockSignals } from './signals';
import type { BlockResult, Check, Float32SectionAnalysis, SectionForm, SectionKind } from './types';

/** Delays of a Direct Form I section in single precision. */
export interface Float32Df1State {
  x1: number;
  x2: number;
  y1: number;
  y2: number;
}

/** Accumulator states of a delta-operator section in single precision. */
export interface Float32DeltaState {
  s1: number;
  s2: number;
}

/**
 * Rounds every value to the nearest binary32 (ties to even), as a C `float` initializer does.
 *
 * @param values - doubles.
 * @returns the binary32 values (as doubles, exactly representable in binary32).
 * @example
 * toFloat32([0.1]); // => [0.10000000149011612]
 */
export function toFloat32(values: readonly number[]): number[] {
  return values.map((v) => Math.fround(v));
}

/** Largest finite binary32 value (FLT_MAX): the clamp of a section without a limit. */
export const FLOAT32_MAX = 3.4028234663852886e38;

/**
 * One sample of a single-precision Direct Form I section, in the operation order of the C code:
 * `acc = b0*x; acc += b1*x1; acc += b2*x2; acc -= a1*y1; acc -= a2*y2;` each product and each
 * sum rounded to binary32, then clamped to +-limit (the stored output is the clamped one).
 *
 * @param k - binary32 [b0, b1, b2, a1, a2].
 * @param state - delays (mutated: shifted by one sample).
 * @param input - x[n], a binary32 value.
 * @param limit - output clamp, a positive binary32 value (default FLT_MAX: no clamp for finite values).
 * @returns y[n] (binary32).
 * @example
 * stepFloat32Df1([0.5, 0, 0, -0.5, 0], { x1: 0, x2: 0, y1: 0, y2: 0 }, 1); // => 0.5
 */
export function stepFloat32Df1(k: readonly number[], state: Float32Df1State, input: number, limit: number = FLOAT32_MAX): number {
  const f = Math.fround;
  let acc = f(k[0] * input);
  acc = f(acc + f(k[1] * state.x1));
  acc = f(acc + f(k[2] * state.x2));
  acc = f(acc - f(k[3] * state.y1));
  acc = f(acc - f(k[4] * state.y2));
  if (acc > limit) acc = limit;
  else if (acc < -limit) acc = -limit;
  state.x2 = state.x1;
  state.x1 = input;
  state.y2 = state.y1;
  state.y1 = acc;
  return acc;
}

/**
 * One sample of a single-precision delta-operator section (see deltaOperator.ts), in the order of
 * the C code: `y = b0*x + s1;` clamped to +-limit, then `s1 = s1 + d1*x - c1*y + s2;
 * s2 = s2 + d2*x - c2*y;` (left to right, every product and sum rounded to binary32; s1 uses the
 * old s2), both accumulators clamped to +-(limit + limit) (infinite for FLT_MAX: no clamp).
 *
 * @param k - binary32 [b0, d1, d2, c1, c2].
 * @param state - accumulators (mutated).
 * @param input - x[n], a binary32 value.
 * @param limit - output clamp, a positive binary32 value (default FLT_MAX).
 * @returns y[n] (binary32).
 * @example
 * stepFloat32Delta([0.5, 1, 0.5, 1.5, 0.5], { s1: 0, s2: 0 }, 1); // => 0.5
 */
export function stepFloat32Delta(k: readonly number[], state: Float32DeltaState, input: number, limit: number = FLOAT32_MAX): number {
  const f = Math.fround;
  let y = f(f(k[0] * input) + state.s1);
  if (y > limit) y = limit;
  else if (y < -limit) y = -limit;
  const bound = f(limit + limit);
  let s1 = f(f(f(state.s1 + f(k[1] * input)) - f(k[3] * y)) + state.s2);
  let s2 = f(f(state.s2 + f(k[2] * input)) - f(k[4] * y));
  if (s1 > bound) s1 = bound;
  else if (s1 < -bound) s1 = -bound;
  if (s2 > bound) s2 = bound;
  else if (s2 < -bound) s2 = -bound;
  state.s1 = s1;
  state.s2 = s2;
  return y;
}

/** Held input of the single-precision stall analysis, per unit of the block input (REFERENCES: a slow low-pass fed 0.3 pu). */
export const FLOAT32_STALL_INPUT_PU = 0.3;

/** Horizon of the stall analysis in time constants 1 / (2 pi fc): the exact response is then within e^-14 of its end value. */
export const FLOAT32_STALL_TIME_CONSTANTS = 20;

/** Cap of the stall simulation, samples (a 0.1 Hz low-pass at 1 MHz would need 3.2e7; such a run is cut here). */
export const FLOAT32_STALL_MAX_SAMPLES = 2_000_000;

/**
 * Where the bit-exact single-precision section settles for a held input: runs the kernel of the
 * form for 20 time constants of the cutoff (at most {@link FLOAT32_STALL_MAX_SAMPLES} samples) and
 * reports the last output. A slow recursion stalls when the per-sample change falls below half an
 * ulp of its state (REFERENCES: "single-precision states stall like a fixed-point dead band with an
 * LSB of 2^-24 of the state's magnitude"); this computes it instead of estimating it.
 *
 * @param form - section form.
 * @param k - binary32 coefficients of that form.
 * @param input - held input, a binary32 value in the block input's unit.
 * @param cutoffHz - cutoff of the low-pass, Hz (> 0).
 * @param samplePeriodS - Ts in seconds.
 * @returns the settled output and the number of samples run.
 * @example
 * float32Settle('delta-operator', butterworth10HzAt32kHz, Math.fround(0.3), 10, 1 / 32000).settledOutput; // => 0.3000034
 */
export function float32Settle(form: SectionForm, k: readonly number[], input: number, cutoffHz: number, samplePeriodS: number): { settledOutput: number; samples: number } {
  const samples = Math.min(FLOAT32_STALL_MAX_SAMPLES, Math.ceil(FLOAT32_STALL_TIME_CONSTANTS / (2 * Math.PI * cutoffHz * samplePeriodS)));
  let y = 0;
  if (form === 'delta-operator') {
    const state: Float32DeltaState = { s1: 0, s2: 0 };
    for (let n = 0; n < samples; n += 1) y = stepFloat32Delta(k, state, input);
  } else {
    const state: Float32Df1State = { x1: 0, x2: 0, y1: 0, y2: 0 };
    for (let n = 0; n < samples; n += 1) y = stepFloat32Df1(k, state, input);
  }
  return { settledOutput: y, samples };
}

/** What {@link analyzeFloat32Section} needs about a section. */
export interface Float32SectionInput {
  kind: SectionKind;
  /** Form the section runs in. */
  form: SectionForm;
  /** Double coefficients of that form, scaled: [b0, b1, b2, a1, a2] or [b0, d1, d2, c1, c2]. */
  coefficients: readonly number[];
  /** Cutoff of a low-pass or prewarp frequency, Hz (null when none). */
  prewarpHz: number | null;
  /** Whether the section has a resonance (resonators, SOGI). */
  resonant: boolean;
  /** Held input of the stall run, in the block input's unit (0.3 per unit). */
  stallInput: number;
}

/**
 * What single precision does to one section: the binary32 coefficients, their resonance, DC gain
 * and pole radius, and for low-passes where the bit-exact model settles for a held input.
 *
 * Method: resonance as CONTRACT section 3 from the rounded coefficients (delta form: the
 * cancellation-free `deltaResonanceHz`); DC gain sum(b) / sum(a) (delta: d2 / c2); stall by
 * {@link float32Settle} with relative error |y_end - x * H(1)| / |x * H(1)|, H(1) of the double design.
 *
 * @param section - form, coefficients, kind, cutoff and stall input.
 * @param samplePeriodS - Ts in seconds.
 * @param designDcGain - DC gain of the double section (the exact end value per unit input).
 * @returns the analysis.
 * @example
 * analyzeFloat32Section({ kind: 'low-pass', form: 'direct-form-1', coefficients: lpf, prewarpHz: 10, resonant: false, stallInput: 0.3 }, 1 / 32000, 1).stall?.relativeError; // => 0.0108
 */
export function analyzeFloat32Section(section: Float32SectionInput, samplePeriodS: number, designDcGain: number | null): Float32SectionAnalysis {
  const k = toFloat32(section.coefficients);
  const delta = section.form === 'delta-operator';
  const a = delta ? [1, k[3] - 2, 1 + (k[4] - k[3])] : [1, k[3], k[4]];
  const sumA = delta ? k[4] : 1 + k[3] + k[4];
  const sumB = delta ? k[2] : k[0] + k[1] + k[2];
  const resonanceHz = section.resonant ? (delta ? deltaResonanceHz(k[3], k[4], samplePeriodS) : resonanceHzFromDenominator(a, samplePeriodS)) : null;
  let stall: Float32SectionAnalysis['stall'] = null;
  if (section.kind === 'low-pass' && section.prewarpHz !== null && section.prewarpHz > 0 && designDcGain !== null) {
    const input = Math.fround(section.stallInput);
    const run = float32Settle(section.form, k, input, section.prewarpHz, samplePeriodS);
    const exact = input * designDcGain;
    stall = { inputPu: FLOAT32_STALL_INPUT_PU, settledOutput: run.settledOutput, relativeError: Math.abs(run.settledOutput - exact) / Math.abs(exact), samples: run.samples };
  }
  return {
    form: section.form,
    coefficients: k,
    resonanceHz,
    dcGain: sumA === 0 ? null : sumB / sumA,
    maxPoleRadius: maxPoleRadius(a),
    stall,
  };
}

/** Relative stall of a low-pass in single precision beyond which a warning is raised (0.1 %, as the fixed-point dead band; common practice, no source). */
export const FLOAT32_STALL_TOLERANCE = 0.001;

/** Integrator dead band of a PI in single precision, per unit of its input, beyond which a warning is raised (0.1 %, common practice, no source). */
export const FLOAT32_INTEGRAL_DEADBAND_LIMIT_PU = 0.001;

/** Context of {@link float32Checks}. */
export interface Float32CheckContext {
  /** Ts in seconds. */
  samplePeriodS: number;
  /** Signals of every block (bases of the inputs and outputs). */
  signals: readonly BlockSignals[];
}

/**
 * Half the spacing of binary32 values at a magnitude: ulp(v) / 2 = 2^(floor(log2 |v|) - 24).
 *
 * @param magnitude - |v| > 0.
 * @returns half an ulp of binary32 at |v|.
 * @example
 * halfUlpFloat32(1); // => 5.960464477539063e-8
 */
export function halfUlpFloat32(magnitude: number): number {
  return 2 ** (Math.floor(Math.log2(magnitude)) - 24);
}

/**
 * Findings of single-precision arithmetic over all blocks whose sections carry `float32`.
 * Ids follow the fixed-point ones where the finding is the same (`pr-h<h>-quantization-drift`,
 * `sogi-quantization-drift`, `<prefix>-dc-gain-error`), plus `<prefix>-float32-stall` for low-passes and
 * `<prefix>-float32-integral-deadband` for PI sections.
 *
 * - resonance drift of the rounded coefficients: `error` above the limit of `resonanceDriftLimit`, else `info`.
 * - low-pass and SOGI low-pass DC gain of the rounded coefficients off by more than 1 %: `warning`.
 * - stall: the bit-exact single-precision low-pass fed 0.3 pu settles more than 0.1 % off: `warning`
 *   (REFERENCES: a 10 Hz second-order low-pass at 32 kHz settles about 1 % off), `info` otherwise.
 * - PI: with the output at 1 pu, an integrator step (b0 + b1) e below half an ulp of binary32 is lost,
 *   so input errors below ulp(1) / (2 |b0 + b1|) are never integrated; `warning` above 0.001 pu.
 *
 * @param blocks - blocks with `float32` on their sections.
 * @param context - Ts and the block signals.
 * @returns the checks.
 * @example
 * float32Checks(analysis.blocks, { samplePeriodS: 1 / 32000, signals }).find((c) => c.id === 'reactive-lpf-float32-stall')?.severity; // => 'warning'
 */
export function float32Checks(blocks: readonly BlockResult[], context: Float32CheckContext): Check[] {
  const checks: Check[] = [];
  const ts = context.samplePeriodS;
  let worstSogi: { check: Check; excess: number } | null = null;
  for (const block of blocks) {
    const signal = context.signals.find((s) => s.blockId === block.id);
    for (const section of block.sections) {
      const f32 = section.float32;
      if (!f32) continue;
      const prefix = block.sections.length > 1 ? `${block.id}-${section.role}` : block.id;
      const where = sectionName(block.id, section.role, block.sections.length);
      const form = f32.form === 'delta-operator' ? 'delta-operator form' : 'Direct Form I';
      const robust = f32.form === 'direct-form-1' && section.kind !== 'gain' && section.kind !== 'pi' ? ROBUST_STRUCTURE_REMEDY : null;
      const make = (id: string, severity: Check['severity'], message: string, value: number | null, limit: number | null, unit: string | null, remedy: string | null): Check => ({
        id, severity, message, value: value !== null && Number.isFinite(value) ? value : null, limit, unit, blockId: block.id, remedy,
      });
      if (section.resonanceHz) {
        const check = resonanceDriftCheck({
          section, blockId: block.id, prefix, where, samplePeriodS: ts, how: `with binary32 coefficients (${form})`, rounded: 'the poles',
          landedHz: f32.resonanceHz, remedies: [robust],
        });
        const isSogi = section.kind !== 'resonator';
        if (isSogi) worstSogi = keepWorstSogi(worstSogi, check);
        else checks.push(check);
      }
      const designDc = section.scaled ? sumOf(section.scaled.b) / sumOf(section.scaled.a) : null;
      if ((section.kind === 'low-pass' || section.kind === 'sogi-low-pass') && designDc !== null && designDc !== 0 && f32.dcGain !== null) {
        const relative = Math.abs(f32.dcGain - designDc) / Math.abs(designDc);
        if (relative > LOW_PASS_DC_GAIN_TOLERANCE) {
          checks.push(make(`${prefix}-dc-gain-error`, 'warning', `${where}: the binary32 coefficients (${form}) have DC gain ${f32.dcGain.toPrecision(6)} instead of ${designDc.toPrecision(6)} (${(100 * relative).toPrecision(3)} % off).`, 100 * relative, 100 * LOW_PASS_DC_GAIN_TOLERANCE, '%', joinRemedies([robust, 'fixed arithmetic with 32-bit words'])));
        }
      }
      if (f32.stall) {
        const bad = f32.stall.relativeError > FLOAT32_STALL_TOLERANCE;
        const percent = (100 * f32.stall.relativeError).toPrecision(3);
        checks.push(make(`${prefix}-float32-stall`, bad ? 'warning' : 'info', `${where}: fed ${f32.stall.inputPu} pu, the single-precision section (${form}) settles at ${f32.stall.settledOutput.toPrecision(7)} after ${f32.stall.samples} samples, ${percent} % off${bad ? ': its states stall once the per-sample change falls below half an ulp' : ''}.`,
          100 * f32.stall.relativeError, 100 * FLOAT32_STALL_TOLERANCE, '%', bad ? joinRemedies([robust, 'fixed arithmetic with 32-bit words']) : null));
      }
      if (section.kind === 'pi' && section.scaled && signal) {
        const integral = Math.abs(section.scaled.b[0] + section.scaled.b[1]);
        if (integral > 0) {
          const inputPu = halfUlpFloat32(signal.output.onePu) / integral / signal.input.onePu;
          const bad = inputPu > FLOAT32_INTEGRAL_DEADBAND_LIMIT_PU;
          checks.push(make(`${prefix}-float32-integral-deadband`, bad ? 'warning' : 'info', `${where}: with its output at 1 pu, single precision drops integrator steps for input errors below ${inputPu.toPrecision(3)} pu.`,
            inputPu, FLOAT32_INTEGRAL_DEADBAND_LIMIT_PU, 'pu', bad ? 'Run the limited PI step of the set and keep its integrator in 32-bit fixed point (choose fixed arithmetic with 32-bit words).' : null));
        }
      }
    }
  }
  if (worstSogi !== null) checks.push(worstSogi.check);
  return checks;
}

function sumOf(v: readonly number[]): number {
  return v.reduce((s, c) => s + c, 0);
}
