/**
 * One section and one block (parallel sections on the same input) of the exported set, in any of
 * its arithmetics and forms, behind one small interface: create a state, step it one sample
 * (with an optional output limit), reset it. The generated C has the same shape
 * (`<p>_taps_step`, `<p>_group_step`, `<p>_group_step_limited`, `<p>_group_reset`).
 *
 * - fixed, Direct Form I: fixedModel.ts (CONTRACT section 3 reference arithmetic);
 * - fixed, delta-operator: deltaModel.ts;
 * - float32, either form: the binary32 kernels of shared/control/float32.ts.
 *
 * Block output: fixed, clamp(sum of the section outputs, +-limit) summed exactly; float32,
 * sum = 0, then sum = fl(sum + y_i) in section order, then the clamp. Each section's own output is
 * clamped to the same limit first, so its state stays bounded while the block is saturated.
 */
import {
  FLOAT32_MAX, stepFloat32Delta, stepFloat32Df1,
  type DeltaFixedCoefficients, type FixedCoefficients, type SectionForm,
} from '../control/index';
import { createDeltaSectionState, resetDeltaSectionState, stepDeltaSection, type DeltaSectionState } from './deltaModel';
import {
  createFixedSectionState, FixedArithmeticError, resetFixedSectionState, signalMax, stepFixedSection, type FixedSectionState,
} from './fixedModel';

/** A section as the exported set runs it. */
export type SectionSpec =
  | { arithmetic: 'fixed'; form: 'direct-form-1'; fixed: FixedCoefficients }
  | { arithmetic: 'fixed'; form: 'delta-operator'; fixed: DeltaFixedCoefficients }
  | { arithmetic: 'float32'; form: SectionForm; coefficients: readonly number[] };

/** State of a single-precision section (either form). */
export interface Float32SectionState {
  readonly arithmetic: 'float32';
  readonly form: SectionForm;
  /** binary32 coefficients of the form. */
  readonly coefficients: readonly number[];
  x1: number;
  x2: number;
  y1: number;
  y2: number;
  s1: number;
  s2: number;
}

/** State of one section of the set. */
export type SectionState = FixedSectionState | DeltaSectionState | Float32SectionState;

/**
 * Reset state of a section.
 *
 * @param spec - the section (validated by the model of its arithmetic and form).
 * @returns a fresh state.
 * @example
 * createSectionState({ arithmetic: 'fixed', form: 'direct-form-1', fixed: section.fixed });
 */
export function createSectionState(spec: SectionSpec): SectionState {
  if (spec.arithmetic === 'float32') {
    if (spec.coefficients.length !== 5 || spec.coefficients.some((c) => Math.fround(c) !== c)) {
      throw new FixedArithmeticError('invalid-coefficients', 'a float32 section needs five binary32 coefficients');
    }
    return { arithmetic: 'float32', form: spec.form, coefficients: spec.coefficients, x1: 0, x2: 0, y1: 0, y2: 0, s1: 0, s2: 0 };
  }
  return spec.form === 'delta-operator' ? createDeltaSectionState(spec.fixed) : createFixedSectionState(spec.fixed);
}

/**
 * Clears a section's state.
 *
 * @param state - the state (mutated).
 * @returns nothing.
 * @example
 * resetSectionState(state);
 */
export function resetSectionState(state: SectionState): void {
  if ('arithmetic' in state) {
    state.x1 = 0; state.x2 = 0; state.y1 = 0; state.y2 = 0; state.s1 = 0; state.s2 = 0;
  } else if ('form' in state) {
    resetDeltaSectionState(state);
  } else {
    resetFixedSectionState(state);
  }
}

/**
 * Largest output of a section or block without a limit: 2^(W-1) - 1 in fixed point, FLT_MAX in float32.
 *
 * @param state - a section state.
 * @returns the value.
 * @example
 * sectionOutputMax(fixed32State); // => 2147483647
 */
export function sectionOutputMax(state: SectionState): number {
  if ('arithmetic' in state) return FLOAT32_MAX;
  return state.signalMax;
}

/**
 * One sample of a section.
 *
 * @param state - the state (mutated).
 * @param input - x[n]: a W-bit integer (fixed) or a binary32 value.
 * @param limit - output clamp in the same unit (default: the largest output, no clamp).
 * @returns y[n].
 * @example
 * stepSection(state, 1000, 500);
 */
export function stepSection(state: SectionState, input: number, limit?: number): number {
  if ('arithmetic' in state) {
    const lim = limit ?? FLOAT32_MAX;
    return state.form === 'delta-operator' ? stepFloat32Delta(state.coefficients, state, input, lim) : stepFloat32Df1(state.coefficients, state, input, lim);
  }
  if ('form' in state) return stepDeltaSection(state, input, limit);
  return stepFixedSection(state, input, limit);
}

/** State of a block of parallel sections. */
export interface BlockState {
  readonly arithmetic: 'fixed' | 'float32';
  readonly sections: SectionState[];
  /** Output clamp when none is given: 2^(W-1) - 1 or FLT_MAX. */
  readonly outputMax: number;
}

/**
 * Reset state of a block.
 *
 * @param specs - its sections (same arithmetic; fixed sections of the same W).
 * @returns the state.
 * @throws FixedArithmeticError for an empty block or mixed arithmetics or word lengths.
 * @example
 * createBlockState(set.blocks[2].sections);
 */
export function createBlockState(specs: readonly SectionSpec[]): BlockState {
  if (specs.length === 0) throw new FixedArithmeticError('invalid-coefficients', 'a block needs at least one section');
  const arithmetic = specs[0].arithmetic;
  const words = new Set(specs.map((s) => (s.arithmetic === 'fixed' ? s.fixed.wordBits : 32)));
  if (specs.some((s) => s.arithmetic !== arithmetic) || words.size !== 1) {
    throw new FixedArithmeticError('invalid-coefficients', 'the sections of a block must share one arithmetic and one word length');
  }
  const sections = specs.map(createSectionState);
  return { arithmetic, sections, outputMax: arithmetic === 'float32' ? FLOAT32_MAX : signalMax([...words][0]) };
}

/**
 * Clears every section of a block.
 *
 * @param state - the block (mutated).
 * @returns nothing.
 * @example
 * resetBlockState(block);
 */
export function resetBlockState(state: BlockState): void {
  state.sections.forEach(resetSectionState);
}

/**
 * One sample of a block: every section steps on the same input with its output clamped to +-limit;
 * the block output is the clamped sum (module comment).
 *
 * @param state - the block (mutated).
 * @param input - x[n].
 * @param limit - output clamp (default: the largest output).
 * @returns the block output.
 * @example
 * stepBlock(prBlock, error, modulationLimit);
 */
export function stepBlock(state: BlockState, input: number, limit: number = state.outputMax): number {
  let sum = 0;
  if (state.arithmetic === 'float32') {
    for (const section of state.sections) sum = Math.fround(sum + stepSection(section, input, limit));
  } else {
    for (const section of state.sections) sum += stepSection(section, input, limit);
  }
  return sum > limit ? limit : sum < -limit ? -limit : sum;
}

/**
 * Reset state of a block of Direct Form I sections (CONTRACT section 3 reference arithmetic).
 *
 * @param sections - quantized sections, all with the same W.
 * @param wordBits - W of the block (must equal every section's W).
 * @returns the block state.
 * @throws FixedArithmeticError when a section's W differs or the block has no section.
 * @example
 * const block = createFixedBlockState([fixedKp, fixedH1], 32);
 */
export function createFixedBlockState(sections: readonly FixedCoefficients[], wordBits: number): BlockState {
  if (sections.length === 0) throw new FixedArithmeticError('invalid-coefficients', 'a block needs at least one section');
  sections.forEach((s, i) => {
    if (s.wordBits !== wordBits) throw new FixedArithmeticError('invalid-coefficients', `section ${i} has wordBits ${s.wordBits}, the block ${wordBits}`);
  });
  return createBlockState(sections.map((fixed) => ({ arithmetic: 'fixed', form: 'direct-form-1', fixed })));
}

/** Alias of {@link resetBlockState} for Direct Form I blocks. */
export const resetFixedBlockState = resetBlockState;

/**
 * One sample of a Direct Form I block: output = sat_W(sum of the saturated section outputs).
 *
 * @param state - block state (mutated).
 * @param input - x[n], W-bit integer (input LSB).
 * @returns the saturated block output (output LSB).
 * @example
 * stepFixedBlock(block, 1000);
 */
export function stepFixedBlock(state: BlockState, input: number): number {
  return stepBlock(state, input);
}

/**
 * Bit-exact run of a block of Direct Form I sections from the reset state.
 *
 * @param sections - quantized sections of the block (same W).
 * @param input - W-bit integer input samples (input LSB).
 * @param wordBits - W.
 * @returns W-bit integer outputs (output LSB).
 * @example
 * runFixedBlock([{ wordBits: 16, fracBits: 14, b: [16384, 0, 0], a: [16384, 0, 0], qFormat: 'Q2.14' }], [5, -7], 16); // => [5, -7]
 */
export function runFixedBlock(sections: readonly FixedCoefficients[], input: readonly number[], wordBits: number): number[] {
  const state = createFixedBlockState(sections, wordBits);
  return input.map((x) => stepBlock(state, x));
}
