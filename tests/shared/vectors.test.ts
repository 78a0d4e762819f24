import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { goldenVectors, sinTurns, xorshift32, VECTOR_MAX_SATURATED_FRACTION } from '../../shared/firmware/vectors';
import { runFixedBlock, safeInputMagnitude } from '../../shared/firmware/index';
import type { FixedCoefficients } from '../../shared/control/types';
import { expectClose } from '../helpers/expectClose';
import { fixtureAnalysis, referenceBlock } from './fixedReference';

const prng = JSON.parse(readFileSync(new URL('../fixtures/scipy/fixed_prng.json', import.meta.url), 'utf8')) as { xorshift32: { seed: number; values: number[] }[] };
const options = { samples: 1200, seed: 20260 };

describe('golden vectors', () => {
  for (const wordBits of [16, 32] as const) {
    describe(`${wordBits}-bit analysis`, () => {
      const analysis = fixtureAnalysis(wordBits);
      const vectors = goldenVectors(analysis, 60, options);

      it('three vectors per block, in block order then step, chirp, noise; deterministic', () => {
        expect(vectors.map((v) => `${v.blockId}/${v.name}`)).toEqual(analysis.blocks.flatMap((b) => ['step', 'chirp', 'noise'].map((n) => `${b.id}/${n}`)));
        expect(goldenVectors(analysis, 60, options)).toEqual(vectors);
        expect(JSON.parse(JSON.stringify(vectors))).toEqual(vectors);
        for (const v of vectors) {
          expect(v.input).toHaveLength(options.samples);
          expect(v.expected).toHaveLength(options.samples);
          expect(v.wordBits).toBe(wordBits);
          expect(v.description.length).toBeGreaterThan(40);
        }
      });

      it('expected equals an independent BigInt evaluation of the CONTRACT formula', () => {
        for (const v of vectors) {
          const block = analysis.blocks.find((b) => b.id === v.blockId)!;
          expect(v.expected, `${v.blockId}/${v.name}`).toEqual(referenceBlock(block.sections.map((s) => s.fixed), v.input, wordBits));
        }
      });

      it('inputs stay within the accumulator-safe amplitude; step and chirp keep 90 % of outputs unsaturated', () => {
        const max = 2 ** (wordBits - 1) - 1;
        for (const v of vectors) {
          const block = analysis.blocks.find((b) => b.id === v.blockId)!;
          const safe = Math.min(...block.sections.map((s) => safeInputMagnitude(s.fixed)));
          expect(v.input.every((x) => Number.isInteger(x) && Math.abs(x) <= safe), `${v.blockId}/${v.name}`).toBe(true);
          expect(Math.max(...v.input.map(Math.abs))).toBeLessThanOrEqual(v.amplitudeLsb!);
          if (v.name === 'step') expect(Math.max(...v.input)).toBe(v.amplitudeLsb);
          const saturated = v.expected.filter((y) => Math.abs(y) === max).length;
          expect(v.saturatedSamples).toBe(saturated);
          if (v.name !== 'noise' && v.amplitudeLsb! > 1) expect(saturated, `${v.blockId}/${v.name}`).toBeLessThanOrEqual(VECTOR_MAX_SATURATED_FRACTION * options.samples);
          if (v.name === 'noise') expect(v.amplitudeLsb).toBe(safe);
        }
        // full-scale noise drives the high-gain blocks into saturation (state saturation exercised)
        expect(vectors.find((v) => v.blockId === 'current-pr' && v.name === 'noise')!.saturatedSamples).toBeGreaterThan(0);
        expect(vectors.find((v) => v.blockId === 'pll-pi' && v.name === 'noise')!.saturatedSamples).toBeGreaterThan(0);
      });

      it('vectors have teeth: one LSB on any non-zero coefficient of any section changes some expected output', () => {
        for (const block of analysis.blocks) {
          const own = vectors.filter((v) => v.blockId === block.id);
          block.sections.forEach((section, si) => {
            const coefficients: [keyof Pick<FixedCoefficients, 'a' | 'b'>, number][] = [['b', 0], ['b', 1], ['b', 2], ['a', 1], ['a', 2]];
            for (const [key, index] of coefficients) {
              if (section.fixed[key][index] === 0) continue;
              const changed = block.sections.map((s, j) => {
                if (j !== si) return s.fixed;
                const copy = { ...s.fixed, b: [...s.fixed.b], a: [...s.fixed.a] };
                copy[key][index] += copy[key][index] > 0 ? -1 : 1; // towards zero keeps it within the word
                return copy;
              });
              const detected = own.some((v) => {
                const out = runFixedBlock(changed, v.input, wordBits);
                return out.some((y, n) => y !== v.expected[n]);
              });
              expect(detected, `${block.id} ${section.role} ${key}${index}`).toBe(true);
            }
          });
        }
      });
    });
  }

  it('chirp sweeps 0.1x to 10x the grid frequency and the noise is the xorshift32 stream', () => {
    const analysis = fixtureAnalysis(32);
    const [step, chirp, noise] = goldenVectors(analysis, 50, { samples: 4000, seed: 7 }).filter((v) => v.blockId === 'sogi-d');
    expect(step.input.slice(0, 16).every((x) => x === 0)).toBe(true);
    expect(step.input.slice(16).every((x) => x === step.amplitudeLsb)).toBe(true);
    const ts = analysis.sampleTimeS;
    const durationS = 4000 * ts;
    chirp.input.forEach((x, n) => {
      const t = n * ts;
      const want = chirp.amplitudeLsb! * Math.sin(2 * Math.PI * (5 * t + ((500 - 5) * t * t) / (2 * durationS)));
      expect(Math.abs(x - want), `chirp sample ${n}`).toBeLessThanOrEqual(0.5 + 1e-5);
    });
    expect(chirp.description).toMatch(/from 5 Hz to 500 Hz/);
    const stream = prng.xorshift32.find((s) => s.seed === 7)!.values;
    const a = noise.amplitudeLsb!;
    expect(noise.input.slice(0, 64)).toEqual(stream.map((u) => (u % (2 * a + 1)) - a));
  });

  it('xorshift32 reproduces the Python stream (Marsaglia 2003) and sinTurns matches Math.sin', () => {
    for (const { seed, values } of prng.xorshift32) {
      const next = xorshift32(seed);
      expect(values.map(() => next())).toEqual(values);
    }
    const zero = xorshift32(0);
    expect(zero()).toBe(prng.xorshift32[0].values[0]); // seed 0 is replaced by 2463534242
    for (let k = -2000; k <= 2000; k += 1) {
      const turns = k * 0.0137 + 1e-3;
      const reduced = turns - Math.round(turns); // exact; keeps Math.sin's argument small
      expectClose(sinTurns(turns), Math.sin(2 * Math.PI * reduced), { atol: 1e-14 }, `sin ${turns}`);
    }
    expectClose(sinTurns(0.25), 1, { atol: 1e-15 }, 'quarter turn');
  });

  it('refuses bad options with the option named', () => {
    const analysis = fixtureAnalysis(16);
    expect(() => goldenVectors(analysis, 60, { samples: 10, seed: 1 })).toThrow(/options\.samples/);
    expect(() => goldenVectors(analysis, 60, { samples: 100, seed: -1 })).toThrow(/options\.seed/);
    expect(() => goldenVectors(analysis, Number.NaN, { samples: 100, seed: 1 })).toThrow(/gridFrequencyHz/);
    expect(() => goldenVectors({ ...analysis, sampleTimeS: 0 }, 60, { samples: 100, seed: 1 })).toThrow(/sampleTimeS/);
  });
});
