// Units at the UI edge (STYLE habit 5): engineers type "0.6 mH", "4.7 µF", "20 kHz"; the design
// stores SI. Conversions divide or multiply by exact powers of ten so decimal inputs round once.
// Writing numbers back as text lives in ./format.
import type { DisplayUnit } from './format';

export { formatInUnit, type DisplayUnit } from './format';

/** Physical dimension of a form quantity, with its SI base symbol. */
export type Dimension = 'H' | 'F' | 'Hz' | 'V' | 'A' | 'VA' | 'Ohm' | 's' | 'deg' | 'ratio' | 'count' | 'gain';

/** Decimal prefixes accepted in typed units, as powers of ten. */
const PREFIX_EXPONENT: Record<string, number> = { p: -12, n: -9, u: -6, 'µ': -6, 'μ': -6, m: -3, '': 0, k: 3, M: 6, G: 9 };

/** Base symbols per dimension as typed (first is the displayed one). */
const BASE_SYMBOLS: Record<Dimension, string[]> = {
  H: ['H'],
  F: ['F'],
  Hz: ['Hz', 'hz', 'HZ'],
  V: ['V', 'v'],
  A: ['A', 'a'],
  VA: ['VA', 'va'],
  Ohm: ['Ω', 'ohm', 'Ohm', 'ohms', 'R'],
  s: ['s'],
  deg: ['°', 'deg'],
  ratio: [''],
  count: [''],
  gain: [''],
};

/**
 * Moves the decimal point of a decimal numeral by `exponent` places and reads it as a double:
 * one correctly rounded decimal-to-binary conversion, so "0.6" in mH is exactly the double 0.0006.
 * @param numeral - a decimal numeral such as `-12.5` or `4.7e-3`.
 * @param exponent - integer power of ten.
 * @returns the double nearest to numeral * 10^exponent.
 */
export function shiftDecimal(numeral: string, exponent: number): number {
  const match = /^([+-]?[\d.]+)(?:[eE]([+-]?\d+))?$/.exec(numeral.trim());
  if (!match) return Number.NaN;
  return Number(`${match[1]}e${Number(match[2] ?? 0) + exponent}`);
}

/** Result of reading a typed quantity. */
export type ParsedQuantity = { ok: true; valueSi: number | null } | { ok: false; message: string };

const NUMBER_AND_UNIT = /^([+-]?(?:\d+(?:[.,]\d*)?|[.,]\d+)(?:[eE][+-]?\d+)?)\s*(\S*)$/;

/**
 * Reads a typed quantity such as `0.6 mH`, `600u`, `4.7 µF`, `20 kHz` or a bare number in the display unit.
 * @param text - what the user typed (blank = null).
 * @param dimension - what the field measures.
 * @param unit - the display unit a bare number is in.
 * @returns the SI value, or a message naming what is wrong.
 */
export function parseQuantity(text: string, dimension: Dimension, unit: DisplayUnit): ParsedQuantity {
  const trimmed = text.trim();
  if (trimmed === '') return { ok: true, valueSi: null };
  const match = NUMBER_AND_UNIT.exec(trimmed);
  if (!match) return { ok: false, message: `“${trimmed}” is not a number${unit.symbol ? ` in ${unit.symbol}` : ''}.` };
  const numeral = match[1].replace(',', '.');
  if (!Number.isFinite(Number(numeral))) return { ok: false, message: `“${trimmed}” is too large.` };
  const suffix = match[2];
  if (suffix === '') return { ok: true, valueSi: shiftDecimal(numeral, unit.exponent) };
  if (dimension === 'ratio' && suffix === '%') return { ok: true, valueSi: shiftDecimal(numeral, -2) };
  for (const base of BASE_SYMBOLS[dimension]) {
    if (base !== '' && suffix.endsWith(base)) {
      const prefix = suffix.slice(0, suffix.length - base.length);
      if (prefix in PREFIX_EXPONENT) return { ok: true, valueSi: shiftDecimal(numeral, PREFIX_EXPONENT[prefix]) };
    }
  }
  // A bare prefix ("600u", "4.7µ", "20k") scales the SI base unit.
  if (suffix in PREFIX_EXPONENT && BASE_SYMBOLS[dimension][0] !== '') return { ok: true, valueSi: shiftDecimal(numeral, PREFIX_EXPONENT[suffix]) };
  const expected = BASE_SYMBOLS[dimension][0];
  return { ok: false, message: expected ? `Unit “${suffix}” does not measure ${expected}; type e.g. ${unit.symbol || expected}.` : `“${trimmed}” takes no unit.` };
}
