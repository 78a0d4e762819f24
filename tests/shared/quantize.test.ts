import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import { maxFracBits, qFormatLabel, quantizeSection, quantizeValue, roundToInteger, type QFormat } from '../../shared/control/quantize';
import { quantizedResonanceHz } from '../../shared/control/fixedPoint';
import { expectClose } from '../helpers/expectClose';

interface SectionCase {
  name: string;
  wordBits: number;
  samplePeriodS: number;
  designHz: number | null;
  b: number[];
  a: number[];
  fracBits: number;
  bInt: number[];
  aInt: number[];
  qFormat: string;
  resonanceHzFixed: number | null;
  sumAInt: number;
}
const fixture = JSON.parse(readFileSync(new URL('../fixtures/scipy/fixed_sections.json', import.meta.url), 'utf8')) as { cases: SectionCase[] };

const q15: QFormat = { wordBits: 16, fracBits: 15, signed: true };
const lsb15 = 2 ** -15;

/** Exact round-half-away-from-zero of c * 2^f for a double c, through its exact binary expansion (test-local, BigInt). */
function exactRoundAway(c: number, f: number): bigint {
  if (c === 0) return 0n;
  // c = mantissa * 2^exponent exactly, mantissa an odd-or-even integer below 2^53
  let mantissa = Math.abs(c);
  let exponent = 0;
  while (!Number.isInteger(mantissa)) { mantissa *= 2; exponent -= 1; }
  let m = BigInt(mantissa);
  const shift = exponent + f; // value = m * 2^shift
  let result: bigint;
  if (shift >= 0) result = m << BigInt(shift);
  else {
    const denom = 1n << BigInt(-shift);
    const q = m / denom;
    const r = m - q * denom;
    result = 2n * r >= denom ? q + 1n : q; // half away from zero on the magnitude
    m = 0n;
  }
  return c < 0 ? -result : result;
}

describe('quantizeValue (STYLE habit 10: max, min, -1, 1 - 2^-F, ties)', () => {
  it.each([
    ['max 1 - 2^-15', 1 - lsb15, 32767, false],
    ['min -1', -1, -32768, false],
    ['zero', 0, 0, false],
    ['one LSB', lsb15, 1, false],
    ['-0 gives code 0', -0, 0, false],
  ])('%s', (_label, value, code, overflowed) => {
    const q = quantizeValue(value, q15, 'nearest-away', 'saturate');
    expect(q.code).toBe(code);
    expect(Object.is(q.code, -0)).toBe(false);
    expect(q.overflowed).toBe(overflowed);
    expectClose(q.value, code * lsb15, { atol: 0 }, 'represented value');
  });

  it('saturates and wraps +1 (one past the max) in two\'s complement', () => {
    expect(quantizeValue(1, q15, 'nearest-away', 'saturate')).toMatchObject({ code: 32767, overflowed: true });
    expect(quantizeValue(1, q15, 'nearest-away', 'wrap')).toMatchObject({ code: -32768, overflowed: true });
    expect(quantizeValue(-1 - lsb15, q15, 'nearest-away', 'saturate')).toMatchObject({ code: -32768, overflowed: true });
    expect(quantizeValue(-1 - lsb15, q15, 'nearest-away', 'wrap')).toMatchObject({ code: 32767, overflowed: true });
    expect(quantizeValue(3.25, q15, 'floor', 'wrap')).toMatchObject({ code: -24576, value: -0.75, overflowed: true }); // 106496 mod 65536 = 40960, minus 65536 (two's complement, common practice)
  });

  // Ties at half an LSB: the four modes of the fixed crate's documented rounding (common practice, no source).
  it.each([
    [0.5, { 'nearest-even': 0, 'nearest-away': 1, floor: 0, zero: 0 }],
    [-0.5, { 'nearest-even': 0, 'nearest-away': -1, floor: -1, zero: 0 }],
    [1.5, { 'nearest-even': 2, 'nearest-away': 2, floor: 1, zero: 1 }],
    [2.5, { 'nearest-even': 2, 'nearest-away': 3, floor: 2, zero: 2 }],
    [-2.5, { 'nearest-even': -2, 'nearest-away': -3, floor: -3, zero: -2 }],
    [-2.75, { 'nearest-even': -3, 'nearest-away': -3, floor: -3, zero: -2 }],
  ])('tie and fraction %s LSB', (lsbs, expected) => {
    for (const [mode, code] of Object.entries(expected)) {
      expect(quantizeValue(lsbs * lsb15, q15, mode as 'floor', 'saturate').code, mode).toBe(code);
    }
  });

  it('rounds exactly where x + 0.5 would round in binary64', () => {
    expect(roundToInteger(0.49999999999999994, 'nearest-away')).toBe(0);
    expect(roundToInteger(-0.49999999999999994, 'nearest-away')).toBe(0);
    expect(roundToInteger(-0.49999999999999994, 'floor')).toBe(-1);
    expect(roundToInteger(-0.49999999999999994, 'nearest-even')).toBe(0);
    expect(roundToInteger(2 ** 52 + 1, 'nearest-away')).toBe(2 ** 52 + 1);
    expect(roundToInteger(4503599627370495.5, 'nearest-away')).toBe(4503599627370496);
    expect(roundToInteger(4503599627370495.5, 'nearest-even')).toBe(4503599627370496);
    expect(roundToInteger(4503599627370494.5, 'nearest-even')).toBe(4503599627370494);
  });

  it('handles unsigned formats and negative fraction bits', () => {
    const u8: QFormat = { wordBits: 8, fracBits: 0, signed: false };
    expect(quantizeValue(255, u8, 'nearest-away', 'saturate')).toMatchObject({ code: 255, overflowed: false });
    expect(quantizeValue(-1, u8, 'nearest-away', 'saturate')).toMatchObject({ code: 0, overflowed: true });
    expect(quantizeValue(256, u8, 'nearest-away', 'wrap')).toMatchObject({ code: 0, overflowed: true });
    const coarse: QFormat = { wordBits: 8, fracBits: -2, signed: true };
    expect(quantizeValue(10, coarse, 'nearest-away', 'saturate')).toMatchObject({ code: 3, value: 12, overflowed: false });
  });

  it('refuses NaN, infinities and bad formats', () => {
    expect(() => quantizeValue(Number.NaN, q15, 'floor', 'saturate')).toThrow(RangeError);
    expect(() => quantizeValue(Infinity, q15, 'floor', 'saturate')).toThrow(/finite/);
    expect(() => quantizeValue(0.5, { wordBits: 1, fracBits: 0, signed: true }, 'floor', 'saturate')).toThrow(/wordBits/);
    expect(() => quantizeValue(0.5, { wordBits: 16, fracBits: 1.5, signed: true }, 'floor', 'saturate')).toThrow(/fracBits/);
  });
});

describe('quantizeSection against exact rational arithmetic (generate_fixed.py, Python fractions + scipy 1.17)', () => {
  it.each(fixture.cases.map((c) => [`${c.name}, ${c.wordBits} bit`, c] as const))('%s', (_label, c) => {
    const fixed = quantizeSection(c.b, c.a, c.wordBits);
    expect(fixed.fracBits).toBe(c.fracBits);
    expect(fixed.b).toEqual(c.bInt);
    expect(fixed.a).toEqual(c.aInt);
    expect(fixed.qFormat).toBe(c.qFormat);
    expect(fixed.wordBits).toBe(c.wordBits);
    if (c.designHz !== null) {
      const hz = quantizedResonanceHz(fixed, c.samplePeriodS);
      if (c.resonanceHzFixed === null) expect(hz).toBeNull();
      else expectClose(hz ?? Number.NaN, c.resonanceHzFixed, { rtol: 1e-12 }, 'quantized resonance Hz');
    }
  });

  // Cross-check values of REFERENCES.md, reproduced from the CONTRACT F rule (scipy 1.17).
  it('16-bit Q14: a 50 Hz resonator at 20 kHz lands at 49.736 Hz, 60 Hz at 40 kHz too', () => {
    const a50 = quantizeSection([1, 0, -1].map((v) => v * 2.499897192889162e-5), [1, -1.999753264963321, 1], 16);
    expect(a50.qFormat).toBe('Q2.14');
    expectClose(quantizedResonanceHz(a50, 5e-5) ?? Number.NaN, 49.736, { atol: 5e-4 }, '50 Hz in Q14');
    const c60 = fixture.cases.find((c) => c.name === 'ideal resonator 60 Hz at 40 kHz' && c.wordBits === 16);
    expect(c60).toBeDefined();
    const f60 = quantizeSection(c60!.b, c60!.a, 16);
    expectClose(quantizedResonanceHz(f60, c60!.samplePeriodS) ?? Number.NaN, 49.736, { atol: 5e-4 }, '60 Hz at 40 kHz in Q14');
  });

  it('16-bit Q14: the 10 Hz Butterworth at 20 kHz gets 1 + a1 + a2 = 0; 32-bit Q30 resonances within 0.2 mHz', () => {
    const bw = quantizeSection([2.461930046414063e-06, 2 * 2.461930046414063e-06, 2.461930046414063e-06], [1, -1.995557124345789, 0.995566972065975], 16);
    expect(bw.a[0] + bw.a[1] + bw.a[2]).toBe(0);
    for (const c of fixture.cases.filter((k) => k.wordBits === 32 && k.designHz !== null && k.name.startsWith('ideal'))) {
      const fixed = quantizeSection(c.b, c.a, 32);
      expect(fixed.qFormat).toBe('Q2.30');
      expectClose(quantizedResonanceHz(fixed, c.samplePeriodS) ?? Number.NaN, c.designHz!, { atol: 2e-4 }, c.name);
    }
  });

  it('labels Q formats with the integer bits including sign, also when negative', () => {
    expect(qFormatLabel(32, 30)).toBe('Q2.30');
    expect(qFormatLabel(32, 35)).toBe('Q-3.35');
    expect(qFormatLabel(16, -2)).toBe('Q18.-2');
    expect(maxFracBits([0, 0], 16)).toBe(62);
    expect(maxFracBits([1e-30], 32)).toBe(62);
    expect(maxFracBits([1e6], 16)).toBe(-5); // 1e6 / 32 = 31250 fits, 1e6 / 16 = 62500 does not
    expect(() => quantizeSection([1], [2], 16)).toThrow(/a\[0\]/);
    expect(() => maxFracBits([Number.NaN], 16)).toThrow(RangeError);
  });
});

describe('quantization properties (fast-check)', () => {
  const coefficient = fc.oneof(
    fc.double({ min: -4, max: 4, noNaN: true, noDefaultInfinity: true }),
    fc.double({ min: -1e-3, max: 1e-3, noNaN: true, noDefaultInfinity: true }),
    fc.double({ min: -300, max: 300, noNaN: true, noDefaultInfinity: true }),
    fc.constantFrom(0, 1, -1, -2, 0.5, -0.5, 2 ** -14, -(2 ** -15)),
  );
  const section = fc.record({ b: fc.tuple(coefficient, coefficient, coefficient), a1: coefficient, a2: coefficient, wordBits: fc.constantFrom(16, 24, 32) });

  it('every integer lies within +-(2^(W-1) - 1) and equals the exact round(c * 2^F)', () => {
    fc.assert(fc.property(section, ({ b, a1, a2, wordBits }) => {
      const fixed = quantizeSection(b, [1, a1, a2], wordBits);
      const limit = 2 ** (wordBits - 1) - 1;
      const all = [...fixed.b, ...fixed.a];
      expect(all.every((k) => Number.isInteger(k) && Math.abs(k) <= limit)).toBe(true);
      const exact = [...b, 1, a1, a2].map((c) => exactRoundAway(c, fixed.fracBits));
      expect(all.map(BigInt)).toEqual(exact);
      expect(fixed.a[0]).toBe(2 ** fixed.fracBits);
    }), { numRuns: 400 });
  });

  it('F is maximal: F = 62 or some coefficient overflows with F + 1', () => {
    fc.assert(fc.property(section, ({ b, a1, a2, wordBits }) => {
      const coefficients = [...b, 1, a1, a2];
      const f = maxFracBits(coefficients, wordBits);
      const limit = BigInt(2 ** (wordBits - 1) - 1);
      const abs = (v: bigint): bigint => (v < 0n ? -v : v);
      expect(coefficients.every((c) => abs(exactRoundAway(c, f)) <= limit)).toBe(true);
      expect(f === 62 || coefficients.some((c) => abs(exactRoundAway(c, f + 1)) > limit)).toBe(true);
    }), { numRuns: 400 });
  });
});
