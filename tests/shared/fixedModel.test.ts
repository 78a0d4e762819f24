import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import {
  AccumulatorOverflowError, FIXED_ARITHMETIC, FixedArithmeticError, createFixedBlockState, createFixedSectionState, resetFixedBlockState,
  resetFixedSectionState, runFixedBlock, runFixedSection, safeInputMagnitude, saturateToWord, stepFixedBlock, stepFixedSection,
} from '../../shared/firmware/index';
import type { FixedCoefficients } from '../../shared/control/types';
import { referenceDf1 } from './fixedReference';

interface SectionCase { name: string; wordBits: number; fracBits: number; bInt: number[]; aInt: number[]; qFormat: string; input: number[]; output: number[] | null }
interface BlockCase { wordBits: number; fixed: { fracBits: number; b: number[]; a: number[] }[]; input: number[]; output: number[] }
const read = <T>(name: string): T => JSON.parse(readFileSync(new URL(`../fixtures/scipy/${name}`, import.meta.url), 'utf8')) as T;
const sections = read<{ cases: SectionCase[] }>('fixed_sections.json').cases;
const blocks = read<{ blocks: BlockCase[] }>('fixed_block.json').blocks;

const fixedOf = (wordBits: number, fracBits: number, b: number[], a: number[]): FixedCoefficients => ({ wordBits, fracBits, b, a, qFormat: `Q${wordBits - fracBits}.${fracBits}` });

describe('runFixedSection against Python integer arithmetic (generate_fixed.py)', () => {
  it.each(sections.filter((c) => c.output !== null).map((c) => [`${c.name}, ${c.wordBits} bit`, c] as const))('%s', (_label, c) => {
    const fixed = fixedOf(c.wordBits, c.fracBits, c.bInt, c.aInt);
    expect(runFixedSection(fixed, c.input)).toEqual(c.output);
  });

  it.each(blocks.map((b) => [`${b.wordBits}-bit proportional + h1 + h3 block`, b] as const))('runFixedBlock: %s', (_label, block) => {
    const fixed = block.fixed.map((s) => fixedOf(block.wordBits, s.fracBits, s.b, s.a));
    const out = runFixedBlock(fixed, block.input, block.wordBits);
    expect(out).toEqual(block.output);
    expect(out.some((y) => Math.abs(y) === 2 ** (block.wordBits - 1) - 1), 'the fixture exercises block saturation').toBe(true);
  });
});

describe('reference arithmetic rules (CONTRACT section 3, FIXED_ARITHMETIC)', () => {
  const half = fixedOf(16, 14, [8192, 0, 0], [16384, 0, 0]); // y = round-half-up(x / 2)

  it('rounds half up: (acc + 2^(F-1)) >> F with floor shift', () => {
    expect(runFixedSection(half, [1, -1, 3, -3, 5, -5, 2, -2])).toEqual([1, 0, 2, -1, 3, -2, 1, -1]);
    expect(runFixedSection(fixedOf(16, 0, [1, 1, 0], [1, 0, 0]), [3, 4])).toEqual([3, 7]); // F = 0: no rounding constant
  });

  it('saturates symmetrically to +-(2^(W-1) - 1): -2^(W-1) never appears', () => {
    const gain4 = fixedOf(16, 12, [16384, 0, 0], [4096, 0, 0]);
    expect(runFixedSection(gain4, [10000, -10000, -32767, 8191, -8191])).toEqual([32767, -32767, -32767, 32764, -32764]);
    expect(saturateToWord(-32768, 16)).toBe(-32767);
    expect(saturateToWord(-(2n ** 40n), 32)).toBe(-(2 ** 31 - 1));
    expect(FIXED_ARITHMETIC.saturation).toBe('symmetric');
  });

  it('feeds the saturated output back (the stored y is the clamped one)', () => {
    // integrator y[n] = y[n-1] + x[n]: saturates, then comes straight back down
    const integrator = fixedOf(16, 14, [16384, 0, 0], [16384, -16384, 0]);
    expect(runFixedSection(integrator, [30000, 30000, -30000, -30000])).toEqual([30000, 32767, 2767, -27233]);
  });

  it('the stateful variant matches the batch run and reset restarts from zero', () => {
    const c = sections.find((k) => k.name.startsWith('SOGI D') && k.wordBits === 32)!;
    const fixed = fixedOf(32, c.fracBits, c.bInt, c.aInt);
    const state = createFixedSectionState(fixed);
    const first = c.input.map((x) => stepFixedSection(state, x));
    expect(first).toEqual(c.output);
    resetFixedSectionState(state);
    expect(state).toMatchObject({ x1: 0, x2: 0, y1: 0, y2: 0, sampleIndex: 0 });
    expect(c.input.map((x) => stepFixedSection(state, x))).toEqual(c.output);
    const block = createFixedBlockState([fixed, fixed], 32);
    const twice = c.input.map((x) => stepFixedBlock(block, x));
    resetFixedBlockState(block);
    expect(c.input.map((x) => stepFixedBlock(block, x))).toEqual(twice);
    expect(twice).toEqual(c.output!.map((y) => saturateToWord(2 * y, 32)));
  });

  it('throws AccumulatorOverflowError when |terms| + 2^(F-1) exceeds 2^63 - 1', () => {
    const max = 2 ** 31 - 1;
    const big = fixedOf(32, 29, [max, -max, 0], [2 ** 29, -(2 ** 29), 0]);
    // sample 0: |b0 x| = (2^31-1)^2 < 2^63; sample 1: + |b1 x1| + |a1 y1| > 2^63 - 1
    let caught: unknown;
    try { runFixedSection(big, [max, -max, max]); } catch (e) { caught = e; }
    expect(caught).toBeInstanceOf(AccumulatorOverflowError);
    expect((caught as AccumulatorOverflowError).sampleIndex).toBe(1);
    expect((caught as AccumulatorOverflowError).code).toBe('accumulator-overflow');
    expect(safeInputMagnitude(big)).toBeLessThan(max);
    const safe = safeInputMagnitude(big);
    expect(() => runFixedSection(big, [safe, -safe, safe, -safe, safe, -safe])).not.toThrow();
    expect(() => runFixedSection(big, [safe + 1, -(safe + 1), safe + 1, -(safe + 1)])).toThrow(AccumulatorOverflowError);
  });

  it('refuses invalid coefficients and inputs with a FixedArithmeticError naming the rule', () => {
    expect(() => runFixedSection(fixedOf(16, 14, [0, 0, 0], [16000, 0, 0]), [1])).toThrow(/a\[0\] must be 2\^F/);
    expect(() => runFixedSection(fixedOf(16, -1, [1, 0, 0], [1, 0, 0]), [1])).toThrow(/fracBits/);
    expect(() => runFixedSection(fixedOf(16, 14, [40000, 0, 0], [16384, 0, 0]), [1])).toThrow(/b\[0\]/);
    expect(() => runFixedSection(half, [32768])).toThrow(FixedArithmeticError);
    expect(() => runFixedSection(half, [-32768])).toThrow(/input sample 0/);
    expect(() => runFixedSection(half, [0.5])).toThrow(/integer/);
    expect(() => runFixedBlock([half, fixedOf(32, 30, [0, 0, 0], [2 ** 30, 0, 0])], [1], 16)).toThrow(/wordBits/);
    expect(() => runFixedBlock([], [1], 16)).toThrow(/at least one section/);
  });
});

describe('bit-exact model properties (fast-check)', () => {
  const arbitrarySection = fc.constantFrom(16, 32).chain((wordBits) => {
    const max = 2 ** (wordBits - 1) - 1;
    return fc.record({
      wordBits: fc.constant(wordBits),
      fracBits: fc.integer({ min: 0, max: wordBits - 2 }),
      b: fc.array(fc.integer({ min: -max, max }), { minLength: 3, maxLength: 3 }),
      a12: fc.array(fc.integer({ min: -max, max }), { minLength: 2, maxLength: 2 }),
      input: fc.array(fc.integer({ min: -max, max }), { minLength: 1, maxLength: 60 }),
    });
  });

  it('output always within the symmetric word, equal to a BigInt evaluation of the formula', () => {
    fc.assert(fc.property(arbitrarySection, ({ wordBits, fracBits, b, a12, input }) => {
      const fixed = fixedOf(wordBits, fracBits, b, [2 ** fracBits, ...a12]);
      // scale the input into the accumulator-safe range so the property is about the arithmetic
      const safe = safeInputMagnitude(fixed);
      const max = 2 ** (wordBits - 1) - 1;
      const x = input.map((v) => (safe === 0 ? 0 : Math.trunc((v / max) * safe)));
      const y = runFixedSection(fixed, x);
      const limit = 2 ** (wordBits - 1) - 1;
      expect(y.every((v) => Number.isInteger(v) && Math.abs(v) <= limit)).toBe(true);
      expect(y).toEqual(referenceDf1(fixed, x));
    }), { numRuns: 300 });
  });
});
