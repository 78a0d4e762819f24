// Unit conversion at the form edge. Prefix values: BIPM, "The International System of Units
// (SI Brochure)", 9th edition, 2019, table 7 (SI prefixes).
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { formatInUnit, parseQuantity, shiftDecimal, type Dimension, type DisplayUnit } from '../../../src/composables/units';
import { expectClose } from '../../helpers/expectClose';

const mH: DisplayUnit = { symbol: 'mH', exponent: -3 };
const uF: DisplayUnit = { symbol: 'µF', exponent: -6 };
const kHz: DisplayUnit = { symbol: 'kHz', exponent: 3 };
const mOhm: DisplayUnit = { symbol: 'mΩ', exponent: -3 };
const ms: DisplayUnit = { symbol: 'ms', exponent: -3 };
const kVA: DisplayUnit = { symbol: 'kVA', exponent: 3 };
const V: DisplayUnit = { symbol: 'V', exponent: 0 };

function si(text: string, dimension: Dimension, unit: DisplayUnit): number | null {
  const parsed = parseQuantity(text, dimension, unit);
  if (!parsed.ok) throw new Error(parsed.message);
  return parsed.valueSi;
}

describe('parseQuantity', () => {
  it.each([
    ['0.6', 'H', mH, 6e-4],
    ['0.6 mH', 'H', mH, 6e-4],
    ['600 µH', 'H', mH, 6e-4],
    ['600uH', 'H', mH, 6e-4],
    ['600u', 'H', mH, 6e-4],
    ['0.0006 H', 'H', mH, 6e-4],
    ['4.7', 'F', uF, 4.7e-6],
    ['4.7 µF', 'F', uF, 4.7e-6],
    ['2200uF', 'F', uF, 2.2e-3],
    ['2.2 mF', 'F', uF, 2.2e-3],
    ['470n', 'F', uF, 4.7e-7],
    ['20', 'Hz', kHz, 20000],
    ['20 kHz', 'Hz', kHz, 20000],
    ['16000 Hz', 'Hz', kHz, 16000],
    ['30', 'Ohm', mOhm, 0.03],
    ['0.03 Ω', 'Ohm', mOhm, 0.03],
    ['0.03 ohm', 'Ohm', mOhm, 0.03],
    ['60', 's', ms, 0.06],
    ['60 ms', 's', ms, 0.06],
    ['3.3', 'VA', kVA, 3300],
    ['3300 VA', 'VA', kVA, 3300],
    ['120', 'V', V, 120],
    ['0,6 mH', 'H', mH, 6e-4],
    ['1e3 µF', 'F', uF, 1e-3],
  ] as const)('reads %s as %s SI', (text, dimension, unit, expected) => {
    expectClose(si(text, dimension, unit)!, expected, { rtol: 0, atol: 0 }, text);
  });

  it('treats blank as absent (designed by rule for gains)', () => {
    expect(parseQuantity('   ', 'gain', { symbol: 'V/A', exponent: 0 })).toEqual({ ok: true, valueSi: null });
  });

  it.each([
    ['abc', 'H', mH, 'is not a number'],
    ['0.6 mV', 'H', mH, 'does not measure H'],
    ['5 kV', 'F', uF, 'does not measure F'],
    ['1e999', 'H', mH, 'too large'],
    ['3 V', 'gain', { symbol: '', exponent: 0 }, 'takes no unit'],
  ] as const)('rejects %s with a message', (text, dimension, unit, message) => {
    const parsed = parseQuantity(text, dimension, unit);
    expect(parsed.ok).toBe(false);
    if (!parsed.ok) expect(parsed.message).toContain(message);
  });

  it('reads a percentage as a ratio', () => {
    expectClose(si('5 %', 'ratio', { symbol: '', exponent: 0 })!, 0.05, { rtol: 1e-15 });
  });
});

describe('formatInUnit', () => {
  it.each([
    [6e-4, mH, '0.6'],
    [4.7e-6, uF, '4.7'],
    [2.2e-3, uF, '2200'],
    [20000, kHz, '20'],
    [0.03, mOhm, '30'],
    [3300, kVA, '3.3'],
  ] as const)('writes %s in %s as %s', (value, unit, text) => {
    expect(formatInUnit(value, unit)).toBe(text);
  });

  it('writes null as an empty field', () => {
    expect(formatInUnit(null, mH)).toBe('');
  });

  it('round-trips any double exactly through the text it shows', () => {
    fc.assert(fc.property(fc.double({ min: 1e-12, max: 1e12, noNaN: true }), fc.constantFrom(mH, uF, kHz, mOhm, ms, kVA, V), (value, unit) => {
      const back = parseQuantity(formatInUnit(value, unit), 'H', unit);
      expect(back.ok).toBe(true);
      if (back.ok) expectClose(back.valueSi!, value, { rtol: 0, atol: 0 });
    }), { numRuns: 2000 });
  });

  it('keeps every digit of sqrt(2) that the double holds', () => {
    expect(formatInUnit(Math.SQRT2, { symbol: '', exponent: 0 })).toBe('1.4142135623730951');
  });

  it('moves the decimal point before rounding to binary (one rounding)', () => {
    expectClose(shiftDecimal('0.6', -3), 0.0006, { rtol: 0, atol: 0 });
    expectClose(shiftDecimal('4.7', -6), 4.7e-6, { rtol: 0, atol: 0 });
    expectClose(shiftDecimal('2.2e3', -6), 2.2e-3, { rtol: 0, atol: 0 });
  });
});
