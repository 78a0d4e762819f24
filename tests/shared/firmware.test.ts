// The composable pieces of shared/firmware: reset equals a fresh state, limits are validated, the
// round shift is the floor shift of the C source (checked exhaustively on small values against
// Math.floor: common practice, no source), a set holds one arithmetic.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyzeDesign, type DesignInput } from '../../shared/control';
import {
  createBlockState, createPiState, FixedArithmeticError, firmwareSet, resetBlockState, resetPiState, roundShift, stepBlock, stepPi,
} from '../../shared/firmware';

const sc3 = JSON.parse(readFileSync(new URL('../../examples/sc3-bench-l-120v.json', import.meta.url), 'utf8')) as DesignInput;
const setOf = (fixedPoint: DesignInput['fixedPoint']) => {
  const d = { ...sc3, fixedPoint };
  return firmwareSet(d, analyzeDesign(d, { sweepPoints: 0, responseSamples: 0 }));
};

describe('roundShift', () => {
  it('is floor((v + 2^(s-1)) / 2^s) for s > 0 and v * 2^-s for s <= 0', () => {
    for (let v = -70; v <= 70; v += 1) {
      for (let s = -3; s <= 5; s += 1) {
        const want = s > 0 ? Math.floor((v + 2 ** (s - 1)) / 2 ** s) : v * 2 ** -s;
        expect(Number(roundShift(BigInt(v), s)), `${v} ${s}`).toBe(want);
      }
    }
  });
});

describe('states', () => {
  it.each([['fixed32', { wordBits: 32 }], ['fixed16 robust', { wordBits: 16, structure: 'quantization-robust' }], ['float32 robust', { wordBits: 32, arithmetic: 'float32', structure: 'quantization-robust' }]] as const)('%s: a reset block and PI run exactly like fresh ones', (_label, fixedPoint) => {
    const set = setOf(fixedPoint as DesignInput['fixedPoint']);
    const one = set.arithmetic === 'fixed' ? 2 ** set.signalFracBits : 1;
    const input = Array.from({ length: 300 }, (_, n) => (set.arithmetic === 'fixed' ? Math.round(0.3 * one * Math.sin(n / 7)) : Math.fround(0.3 * Math.sin(n / 7))));
    for (const block of set.blocks) {
      const state = createBlockState(block.sections);
      const first = input.map((x) => stepBlock(state, x));
      resetBlockState(state);
      expect(input.map((x) => stepBlock(state, x)), block.id).toEqual(first);
    }
    const pi = createPiState(set.pi['pll-pi']);
    const limit = set.limits.pllFrequency.word;
    const first = input.map((x) => stepPi(pi, x, limit));
    resetPiState(pi);
    expect(input.map((x) => stepPi(pi, x, limit))).toEqual(first);
  });

  it('refuses a limit outside the word, a non-integer input and a block mixing arithmetics', () => {
    const fixed = setOf({ wordBits: 16 });
    const float = setOf({ wordBits: 32, arithmetic: 'float32' });
    const pi = createPiState(fixed.pi['voltage-pi']);
    expect(() => stepPi(pi, 1, 40000)).toThrow(FixedArithmeticError);
    expect(() => stepPi(pi, 0.5, 100)).toThrow(/integer/);
    const block = createBlockState(fixed.blocks[2].sections);
    expect(() => stepBlock(block, 1, -1)).toThrow(/limit/);
    expect(() => createBlockState([fixed.blocks[0].sections[0], float.blocks[0].sections[0]])).toThrow(/one arithmetic/);
    expect(() => createBlockState([])).toThrow(/at least one section/);
  });
});
