import { roundToInteger, type AnalysisResult, type BlockId, type DesignInput } from '../control/index';
import { safeInputMagnitude, signalMax } from './fixedModel';
import { createPiState, stepPi } from './limits';
import { createBlockState, stepBlock } from './sections';
import { sectionSpec, type FirmwareLimit, type FirmwareSet } from './set';

/** One golden test vector: a documented excitation of one block and the bit-exact expected output. */
export interface GoldenVector {
  blockId: BlockId;
  /** `step`, `chirp` or `noise`. */
  name: string;
  /** How the excitation was made (amplitude in LSB, frequencies in Hz, seed). */
  description: string;
  wordBits: number;
  /** Input samples: W-bit integers (input LSB), or binary32 values for a float32 set. */
  input: number[];
  /** Bit-exact outputs of the set's model for `input`, same representation. */
  expected: number[];
  /** Arithmetic of the samples (absent = fixed). */
  arithmetic?: 'fixed' | 'float32';
  /** What runs the vector: the block filter (absent), the limited PI, or the limited block (PR). */
  kind?: 'block' | 'limited-pi' | 'limited-block';
  /** Output limit of a limited vector, in the output word. */
  limit?: number;
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
 * the reference arithmetic (FIXED_ARITHMETIC: sat_W of the sum of saturated sections; each section in
 * Direct Form I, or in the delta-operator form of deltaModel.ts when the analysis put it there).
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
    if (block.sections.length === 0) continue;
    const specs = block.sections.map((s) => sectionSpec(s, 'fixed'));
    const wordBits = block.sections[0].fixed.wordBits;
    const max = signalMax(wordBits);
    // Direct Form I sections bound the input for the 64-bit accumulator; delta-operator sections take the whole word.
    const safe = Math.min(max, ...specs.map((s) => (s.arithmetic === 'fixed' && s.form === 'direct-form-1' ? safeInputMagnitude(s.fixed) : max)));
    const run = (input: number[]): number[] => {
      const state = createBlockState(specs);
      return input.map((x) => stepBlock(state, x));
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

/** Amplitude of the float32 block vectors, per unit of the block input (well inside every signal's range). */
export const FLOAT32_VECTOR_AMPLITUDE_PU = 0.5;

/**
 * Golden vectors of a float32 set: for each block a `step`, a `chirp` and a `noise` vector like
 * {@link goldenVectors}, in binary32. With A = fl(0.5 x the input's 1 pu) (fl = nearest binary32):
 * step 0 for min(16, samples / 8) samples then A; chirp fl(A sin(2 pi (f0 t + (f1 - f0) t^2 / (2 T))))
 * with `sinTurns`; noise fl(A (u / 2^31 - 1)), u from xorshift32 with the seed. Expected outputs
 * from the bit-exact binary32 block model (sections.ts). Deterministic: basic IEEE operations only.
 *
 * @param set - a float32 firmware set.
 * @param gridFrequencyHz - grid frequency (chirp band), Hz.
 * @param samplePeriodS - Ts in seconds.
 * @param options - samples and seed as for {@link goldenVectors}.
 * @returns three vectors per block, block order of the set.
 * @example
 * float32GoldenVectors(set, 60, 5e-5, { samples: 1000, seed: 1 })[0].input[999]; // => 0.5 (voltage-pi step, per unit)
 */
export function float32GoldenVectors(set: FirmwareSet, gridFrequencyHz: number, samplePeriodS: number, options: GoldenVectorOptions): GoldenVector[] {
  const { samples, seed } = options;
  if (set.arithmetic !== 'float32') throw new RangeError('float32GoldenVectors needs a float32 set');
  if (!Number.isInteger(samples) || samples < 32 || samples > 1_000_000) throw new RangeError(`options.samples must be an integer in [32, 1000000], got ${samples}`);
  const lead = Math.min(16, Math.floor(samples / 8));
  const [m0, m1] = CHIRP_BAND_GRID_MULTIPLES;
  const f0 = m0 * gridFrequencyHz;
  const f1 = m1 * gridFrequencyHz;
  const durationS = samples * samplePeriodS;
  const vectors: GoldenVector[] = [];
  for (const block of set.blocks) {
    const amplitude = Math.fround(FLOAT32_VECTOR_AMPLITUDE_PU * set.inputOnePu[block.id]);
    const next = xorshift32(seed);
    const inputs: [string, number[], string][] = [
      ['step', Array.from({ length: samples }, (_, n) => (n < lead ? 0 : amplitude)), `step: 0 for ${lead} samples, then ${amplitude} (0.5 pu)`],
      ['chirp', Array.from({ length: samples }, (_, n) => {
        const t = n * samplePeriodS;
        return Math.fround(amplitude * sinTurns(f0 * t + ((f1 - f0) * t * t) / (2 * durationS)));
      }), `chirp: ${amplitude} (0.5 pu) linear sweep from ${fmtHz(f0)} Hz to ${fmtHz(f1)} Hz over ${samples} samples`],
      ['noise', Array.from({ length: samples }, () => Math.fround(amplitude * (next() / 2 ** 31 - 1))), `noise: fl(${amplitude} (u / 2^31 - 1)), xorshift32 seed ${seed === 0 ? XORSHIFT_ZERO_SEED_REPLACEMENT : seed}`],
    ];
    for (const [name, input, description] of inputs) {
      const state = createBlockState(block.sections);
      vectors.push({ blockId: block.id, name, description, wordBits: 32, input, expected: input.map((x) => stepBlock(state, x)), arithmetic: 'float32', kind: 'block' });
    }
  }
  return vectors;
}

/** Fraction of a limit vector spent on each phase: push into saturation, reverse, then a small error. */
export const LIMIT_VECTOR_PHASES = [0.4, 0.7] as const;

/**
 * Vectors of the limited steps: the DC-link PI (current-reference clamp) and the PLL PI (frequency
 * clamp) each get `limit-step`: e = +E for 40 % of the samples, -E up to 70 %, then +E/16, with
 * E = min(2, 1.5 limit / (|kp| + 0.4 N |kh|)) pu of the input so the output saturates early in the
 * first phase (the clamped output, the hold of the integrator and the recovery are all exercised);
 * the PR block gets `limit-sine`: E sin(2 pi f0 n Ts) for half the samples, then 0, with
 * E = min(2, 1.5 limit / |kp|) pu, so the clamp and the bounded resonator states act and the
 * states ring down afterwards. Inputs: round half away from zero of the per-unit value times
 * 2^F (fixed) or its binary32 (float32); expected outputs from the bit-exact models.
 *
 * @param set - the firmware set.
 * @param design - the design (grid frequency).
 * @param samplePeriodS - Ts in seconds.
 * @param samples - samples per vector, integer in [32, 1 000 000].
 * @returns three vectors: voltage-pi, pll-pi, current-pr.
 * @example
 * limitVectors(set, design, 5e-5, 1000).map((v) => `${v.blockId}/${v.name}`); // => ['voltage-pi/limit-step', 'pll-pi/limit-step', 'current-pr/limit-sine']
 */
export function limitVectors(set: FirmwareSet, design: DesignInput, samplePeriodS: number, samples: number): GoldenVector[] {
  if (!Number.isInteger(samples) || samples < 32 || samples > 1_000_000) throw new RangeError(`samples must be an integer in [32, 1000000], got ${samples}`);
  const fixed = set.arithmetic === 'fixed';
  const toWord = (valuePu: number, onePu: number): number => {
    const v = valuePu * onePu;
    if (!fixed) return Math.fround(v);
    return Math.max(-set.signalMax, Math.min(set.signalMax, roundToInteger(v * 2 ** set.signalFracBits, 'nearest-away')));
  };
  const gainValue = (code: number, fracBits: number): number => code * 2 ** -fracBits;
  const vectors: GoldenVector[] = [];
  const [p1, p2] = LIMIT_VECTOR_PHASES;
  const piCases: ['voltage-pi' | 'pll-pi', FirmwareLimit][] = [['voltage-pi', set.limits.currentReference], ['pll-pi', set.limits.pllFrequency]];
  for (const [id, limit] of piCases) {
    const taps = set.pi[id];
    const kp = taps.arithmetic === 'fixed' ? gainValue(taps.kp, taps.kpFracBits) : taps.kp;
    const kh = taps.arithmetic === 'fixed' ? gainValue(taps.ki, taps.kiFracBits) : taps.ki;
    const inPu = set.inputOnePu[id];
    const outPu = set.outputOnePu[id];
    const limitPu = limit.value / outPu;
    const e = Math.min(2, (1.5 * limitPu) / (((Math.abs(kp) + 0.4 * samples * Math.abs(kh)) * inPu) / outPu));
    const input = Array.from({ length: samples }, (_, n) => toWord(n < p1 * samples ? e : n < p2 * samples ? -e : e / 16, inPu));
    const state = createPiState(taps);
    vectors.push({
      blockId: id, name: 'limit-step', kind: 'limited-pi', limit: limit.word, arithmetic: set.arithmetic, wordBits: set.wordBits, input,
      expected: input.map((x) => stepPi(state, x, limit.word)),
      description: `limited PI: e = +${fmtHz(e)} pu for ${Math.ceil(p1 * samples)} samples, -${fmtHz(e)} pu up to sample ${Math.ceil(p2 * samples)}, then +${fmtHz(e / 16)} pu; clamp ${fmtHz(limitPu)} pu, conditional integration`,
    });
  }
  const pr = set.blocks.find((b) => b.id === 'current-pr');
  if (pr) {
    const inPu = set.inputOnePu['current-pr'];
    const outPu = set.outputOnePu['current-pr'];
    const first = pr.sections[0];
    const kp = first.arithmetic === 'float32' ? first.coefficients[0] : first.form === 'direct-form-1' ? gainValue(first.fixed.b[0], first.fixed.fracBits) : 0;
    const limit = set.limits.modulation;
    const limitPu = limit.value / outPu;
    const e = Math.min(2, (1.5 * limitPu) / Math.max(1e-9, (Math.abs(kp) * inPu) / outPu));
    const f0 = design.grid.frequencyHz;
    const input = Array.from({ length: samples }, (_, n) => toWord(n < samples / 2 ? e * sinTurns(f0 * n * samplePeriodS) : 0, inPu));
    const state = createBlockState(pr.sections);
    vectors.push({
      blockId: 'current-pr', name: 'limit-sine', kind: 'limited-block', limit: limit.word, arithmetic: set.arithmetic, wordBits: set.wordBits, input,
      expected: input.map((x) => stepBlock(state, x, limit.word)),
      description: `limited PR: e = ${fmtHz(e)} pu sin(2 pi ${f0} Hz t) for ${Math.ceil(samples / 2)} samples, then 0; clamp ${fmtHz(limitPu)} pu on the output and on every section`,
    });
  }
  return vectors;
}
