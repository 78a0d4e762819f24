import type { AnalysisResult, BlockId, FixedCoefficients } from './types';
import { createFixedBlockState, safeInputMagnitude, signalMax, stepFixedBlock } from './fixedModel';
import { roundToInteger } from './quantize';

/** One golden test vector: a documented excitation of one block and the bit-exact expected output. */
export interface GoldenVector {
  blockId: BlockId;
  /** `step`, `chirp` or `noise`. */
  name: string;
  /** How the excitation was made (amplitude in LSB, frequencies in Hz, seed). */
  description: string;
  wordBits: number;
  /** W-bit integer input samples (input LSB). */
  input: number[];
  /** W-bit integer block outputs of `runFixedBlock` for `input` (output LSB). */
  expected: number[];
  /** Peak input amplitude A in LSB. */
  amplitudeLsb?: number;
  /** How many expected outputs sit at the saturation bound +-(2^(W-1) - 1). */
  saturatedSamples?: number;
}

/** Options of the golden-vector generator. */
export interface GoldenVectorOptions {
  /** Samples per vector, integer in [32, 1 000 000]. */
  samples: number;
  /** Seed of the noise excitation, integer in [0, 2^32 - 1] (0 is replaced by 2463534242). */
  seed: number;
}

/** Share of saturated block outputs allowed in the step and chirp vectors (they must stay sensitive to every coefficient). */
export const VECTOR_MAX_SATURATED_FRACTION = 0.1;

/** Chirp band as multiples of the grid frequency (0.1x to 10x). */
export const CHIRP_BAND_GRID_MULTIPLES = [0.1, 10] as const;

/** Seed used by xorshift32 when the requested seed is 0 (the all-zero state is a fixed point). */
export const XORSHIFT_ZERO_SEED_REPLACEMENT = 2463534242;

/**
 * xorshift32 pseudo-random generator (Marsaglia, "Xorshift RNGs", Journal of Statistical Software
 * 8(14), 2003; shifts 13, 17, 5). Integer-only, so the stream is identical on every platform.
 *
 * @param seed - initial state, integer in [0, 2^32 - 1]; 0 is replaced by 2463534242.
 * @returns a function giving the next unsigned 32-bit value on each call.
 * @example
 * const next = xorshift32(2463534242);
 * next(); // => 723471715
 */
export function xorshift32(seed: number): () => number {
  if (!Number.isInteger(seed) || seed < 0 || seed > 0xffffffff) throw new RangeError(`seed must be an integer in [0, 2^32 - 1], got ${seed}`);
  let state = seed === 0 ? XORSHIFT_ZERO_SEED_REPLACEMENT : seed;
  return () => {
    state ^= state << 13;
    state >>>= 0;
    state ^= state >>> 17;
    state ^= state << 5;
    state >>>= 0;
    return state;
  };
}

/**
 * sin(2 pi turns) from basic IEEE operations only (+, -, *, floor), so it is bit-identical on every
 * platform (Math.sin is not specified to the last bit).
 *
 * Method: reduce to u in [-1/4, 1/4] turn by sin(2 pi u) symmetries, then the Taylor series of
 * sin(x), x = 2 pi u, |x| <= pi/2, through x^19 / 19! (truncation below 3e-15; Abramowitz & Stegun 4.3.65).
 *
 * @param turns - angle in turns (cycles), finite.
 * @returns the sine (dimensionless), |error| below 1e-14.
 * @example
 * sinTurns(0.25); // => 1
 */
export function sinTurns(turns: number): number {
  let u = turns - Math.floor(turns); // [0, 1)
  if (u > 0.5) u -= 1; // (-0.5, 0.5]
  if (u > 0.25) u = 0.5 - u;
  else if (u < -0.25) u = -0.5 - u;
  const x = 2 * Math.PI * u;
  const x2 = x * x;
  let term = x;
  let sum = x;
  for (let k = 1; k <= 9; k += 1) {
    term = (-term * x2) / ((2 * k) * (2 * k + 1));
    sum += term;
  }
  return sum;
}

interface Shape {
  name: 'step' | 'chirp' | 'noise';
  make: (amplitude: number) => number[];
  describe: (amplitude: number) => string;
  /** True when the amplitude is searched so that at most 10 % of the outputs saturate. */
  searched: boolean;
}

/**
 * Golden vectors for every block of an analysis: for each block (in `analysis.blocks` order) a
 * `step`, a `chirp` and a `noise` vector, in that order; `expected` is the bit-exact block output of
 * the reference arithmetic (FIXED_ARITHMETIC: DF-I, sat_W of the sum of saturated sections).
 *
 * - Accumulator: every input stays within X = min over the block's sections of `safeInputMagnitude`,
 *   so the 64-bit accumulator bound holds for every possible output: the vectors can never
 *   overflow int64 in the C code either.
 * - `step`: 0 for the first min(16, samples/8) samples, then +A held. `chirp`: linear sweep
 *   A sin(2 pi (f0 t + (f1 - f0) t^2 / (2 T))), f0 = 0.1 x and f1 = 10 x the grid frequency over
 *   T = samples * Ts, t = n Ts (linear so the phase needs only basic arithmetic: bit-identical
 *   everywhere, see `sinTurns`), rounded half away from zero. For both, A is the largest X / 2^k
 *   (k = 0, 1, ...) with at most 10 % of the outputs saturated (binary search on k), so the
 *   outputs stay sensitive to every coefficient while using as much of the word as possible.
 * - `noise`: integers uniform on [-X, X] (xorshift32 u, code = (u mod (2X + 1)) - X; the modulo
 *   bias is below 2^-32 * (2X + 1)) with the same seed for every block: full-scale excitation that
 *   drives the block output, and therefore the fed-back output states, into saturation wherever
 *   the block's gain exceeds one (PI, PR); low-gain blocks see the whole word instead.
 *
 * Deterministic: integer arithmetic, basic IEEE operations and the seed only.
 *
 * @param analysis - the analysis result (sections with `fixed`; `sampleTimeS` in seconds).
 * @param gridFrequencyHz - grid frequency in Hz (chirp band 0.1x to 10x).
 * @param options - samples per vector and seed.
 * @returns 3 vectors per block, in block order then step, chirp, noise.
 * @throws RangeError for bad options; FixedArithmeticError when a section cannot run in the
 *   reference arithmetic (F < 0, mixed word lengths in a block).
 * @example
 * goldenVectors(analysis, 60, { samples: 2000, seed: 1 }).map((v) => `${v.blockId}/${v.name}`);
 * // => ['voltage-pi/step', 'voltage-pi/chirp', 'voltage-pi/noise', 'pll-pi/step', ...]
 */
export function goldenVectors(analysis: AnalysisResult, gridFrequencyHz: number, options: GoldenVectorOptions): GoldenVector[] {
  const { samples, seed } = options;
  if (!Number.isInteger(samples) || samples < 32 || samples > 1_000_000) throw new RangeError(`options.samples must be an integer in [32, 1000000], got ${samples}`);
  if (!Number.isInteger(seed) || seed < 0 || seed > 0xffffffff) throw new RangeError(`options.seed must be an integer in [0, 2^32 - 1], got ${seed}`);
  if (!(gridFrequencyHz > 0) || !Number.isFinite(gridFrequencyHz)) throw new RangeError(`gridFrequencyHz must be positive and finite, got ${gridFrequencyHz}`);
  const ts = analysis.sampleTimeS;
  if (!(ts > 0) || !Number.isFinite(ts)) throw new RangeError(`analysis.sampleTimeS must be positive and finite, got ${ts}`);

  const vectors: GoldenVector[] = [];
  for (const block of analysis.blocks) {
    const fixed: FixedCoefficients[] = block.sections.map((s) => s.fixed);
    if (fixed.length === 0) continue;
    const wordBits = fixed[0].wordBits;
    const max = signalMax(wordBits);
    const safe = Math.min(...fixed.map(safeInputMagnitude));
    const run = (input: number[]): number[] => {
      const state = createFixedBlockState(fixed, wordBits);
      return input.map((x) => stepFixedBlock(state, x));
    };
    const percent = (a: number): string => `${Number(((100 * a) / max).toPrecision(4))} % of full scale`;
    const lead = Math.min(16, Math.floor(samples / 8));
    const [m0, m1] = CHIRP_BAND_GRID_MULTIPLES;
    const f0 = m0 * gridFrequencyHz;
    const f1 = m1 * gridFrequencyHz;
    const durationS = samples * ts;
    const shapes: Shape[] = [
      {
        name: 'step', searched: true,
        make: (a) => Array.from({ length: samples }, (_, n) => (n < lead ? 0 : a)),
        describe: (a) => `step: 0 for ${lead} samples, then +${a} LSB (${percent(a)}) held for ${samples - lead} samples`,
      },
      {
        name: 'chirp', searched: true,
        make: (a) => Array.from({ length: samples }, (_, n) => {
          const t = n * ts;
          const turns = f0 * t + ((f1 - f0) * t * t) / (2 * durationS);
          return roundToInteger(a * sinTurns(turns), 'nearest-away');
        }),
        describe: (a) => `chirp: ${a} LSB (${percent(a)}) linear sweep from ${fmtHz(f0)} Hz to ${fmtHz(f1)} Hz over ${samples} samples (${fmtHz(durationS)} s at Ts = ${ts} s), rounded half away from zero`,
      },
      {
        name: 'noise', searched: false,
        make: (a) => {
          const next = xorshift32(seed);
          const span = 2 * a + 1;
          return Array.from({ length: samples }, () => (next() % span) - a);
        },
        describe: (a) => `noise: uniform integers in [-${a}, ${a}] LSB (${percent(a)}), xorshift32 seed ${seed === 0 ? XORSHIFT_ZERO_SEED_REPLACEMENT : seed}, code = (u mod ${2 * a + 1}) - ${a}; full-scale excitation: it saturates the block output and the fed-back output states wherever the block gain exceeds one`,
      },
    ];
    const allowed = Math.floor(VECTOR_MAX_SATURATED_FRACTION * samples);
    for (const shape of shapes) {
      let amplitude = safe;
      let input = shape.make(amplitude);
      let expected = run(input);
      if (shape.searched && safe > 1 && countSaturated(expected, max) > allowed) {
        // binary search for the smallest k (largest A = floor(safe / 2^k) >= 1) meeting the saturation budget
        let low = 0; // known to fail
        let high = Math.floor(Math.log2(safe)); // A = 1 (accepted even if it fails)
        let best: { input: number[]; expected: number[]; amplitude: number } | null = null;
        while (high - low > 1) {
          const k = Math.floor((low + high) / 2);
          const a = Math.max(1, Math.floor(safe / 2 ** k));
          const candidate = shape.make(a);
          const out = run(candidate);
          if (countSaturated(out, max) <= allowed) {
            high = k;
            best = { input: candidate, expected: out, amplitude: a };
          } else {
            low = k;
          }
        }
        if (best === null) {
          const a = Math.max(1, Math.floor(safe / 2 ** high));
          const candidate = shape.make(a);
          best = { input: candidate, expected: run(candidate), amplitude: a };
        }
        ({ input, expected, amplitude } = best);
      }
      const saturatedSamples = countSaturated(expected, max);
      vectors.push({
        blockId: block.id,
        name: shape.name,
        description: `${shape.describe(amplitude)}; ${saturatedSamples} of ${samples} outputs saturated`,
        wordBits,
        input,
        expected,
        amplitudeLsb: amplitude,
        saturatedSamples,
      });
    }
  }
  return vectors;
}

function countSaturated(values: readonly number[], max: number): number {
  let count = 0;
  for (const v of values) if (v === max || v === -max) count += 1;
  return count;
}

function fmtHz(v: number): string {
  return Number(v.toPrecision(6)).toString();
}
