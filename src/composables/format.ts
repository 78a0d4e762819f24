// The one place where the client turns numbers into text. Every page, table, plot tooltip and
// axis goes through here: fractions read as percent, SI quantities with an engineering prefix
// (680 µF, 1.2 kHz), a sensible number of significant digits, and an exact text for hovering.
// Form inputs use `formatInUnit` (the shortest text that reads back to the same double).

/** Prefixes used for display, as powers of ten (BIPM SI Brochure, 9th edition, table 7). */
const PREFIXES: readonly [number, string][] = [
  [-12, 'p'], [-9, 'n'], [-6, 'µ'], [-3, 'm'], [0, ''], [3, 'k'], [6, 'M'], [9, 'G'],
];

/** SI symbols that take an engineering prefix when shown. */
const PREFIXED_SYMBOLS = new Set(['Hz', 'V', 'A', 'F', 'H', 's', 'Ω', 'W', 'VA', 'var']);

/** How a check or analysis unit keyword is shown (value suffix; null = plain number). */
const UNIT_WORDS: Record<string, string> = {
  Ohm: 'Ω', ohm: 'Ω', deg: '°', ratio: '×', coefficients: 'coefficients', LSB: 'LSB', bit: 'bit', samples: 'samples',
};

/** A display unit: symbol shown beside an input and its power of ten relative to SI. */
export interface DisplayUnit {
  symbol: string;
  exponent: number;
}

/** Text for a value that is absent. */
export const ABSENT = '—';

/**
 * A number with `digits` significant digits and no trailing zeros; very large or very small
 * magnitudes in scientific notation. Integers below a million are shown whole.
 * @param value - the number (null, NaN and infinities show as "—").
 * @param digits - significant digits (default 4).
 * @returns the text, e.g. `0.9971`, `1009`, `2.5e-7`.
 */
export function formatNumber(value: number | null | undefined, digits = 4): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return ABSENT;
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  if (Number.isInteger(value) && magnitude < 1e6) return String(value);
  if (magnitude >= 1e6 || magnitude < 1e-4) {
    const [mantissa, exponent] = value.toExponential(digits - 1).split('e');
    return `${String(Number(mantissa))}e${Number(exponent)}`;
  }
  return String(Number(value.toPrecision(digits)));
}

/**
 * A quantity in an SI unit with the engineering prefix that puts the mantissa in [1, 1000):
 * `0.00068 F` reads `680 µF`, `1250 Hz` reads `1.25 kHz`.
 * @param valueSi - the value in the SI unit.
 * @param symbol - the SI symbol (`F`, `Hz`, `Ω`...).
 * @param digits - significant digits (default 4).
 * @returns the text with a thin space before the unit.
 */
export function formatEngineering(valueSi: number | null | undefined, symbol: string, digits = 4): string {
  if (valueSi === null || valueSi === undefined || !Number.isFinite(valueSi)) return ABSENT;
  if (valueSi === 0) return `0 ${symbol}`;
  const power = Math.floor(Math.log10(Math.abs(valueSi)) / 3) * 3;
  const clamped = Math.max(-12, Math.min(9, power));
  const prefix = PREFIXES.find(([p]) => p === clamped)?.[1] ?? '';
  let mantissa = Number((valueSi / 10 ** clamped).toPrecision(digits));
  // Rounding can carry into the next prefix (999.96 → 1000): step up.
  if (Math.abs(mantissa) >= 1000 && clamped < 9) return formatEngineering(Math.sign(valueSi) * 10 ** (clamped + 3), symbol, digits);
  if (Object.is(mantissa, -0)) mantissa = 0;
  return `${String(mantissa)} ${prefix}${symbol}`;
}

/**
 * A value as its unit keyword says it should read: `fraction` as percent, `deg` with a degree
 * sign, SI symbols with an engineering prefix, dB, ratios with ×; no unit = a plain number.
 * @param value - the value (SI, or a fraction for `fraction`).
 * @param unit - the unit keyword of an analysis result or check (`Hz`, `fraction`, `deg`, `dB`, `%`...).
 * @param digits - significant digits (default 4).
 * @returns the text, e.g. `5.209 %`, `57.6°`, `680 µF`, `9.93 dB`.
 */
export function formatQuantity(value: number | null | undefined, unit: string | null | undefined, digits = 4): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return ABSENT;
  if (!unit) return formatNumber(value, digits);
  if (unit === 'fraction') return `${formatNumber(value * 100, digits)} %`;
  if (unit === '%') return `${formatNumber(value, digits)} %`;
  if (unit === 'deg' || unit === '°') return `${formatNumber(value, digits)}°`;
  if (unit === 'dB') return `${formatNumber(value, digits)} dB`;
  const symbol = UNIT_WORDS[unit] ?? unit;
  if (PREFIXED_SYMBOLS.has(symbol)) return formatEngineering(value, symbol, digits);
  if (symbol === '×') return `${formatNumber(value, digits)} ×`;
  return `${formatNumber(value, digits)} ${symbol}`;
}

/**
 * The exact stored value with its unit, for a hover title: every digit of the double.
 * @param value - the value (SI, or a fraction for `fraction`).
 * @param unit - the unit keyword.
 * @returns the text, e.g. `0.0006800000000000001 F`.
 */
export function formatExact(value: number | null | undefined, unit?: string | null): string {
  if (value === null || value === undefined) return 'absent';
  if (!Number.isFinite(value)) return String(value);
  if (unit === 'fraction') return `${String(value)} (${String(value * 100)} %)`;
  const symbol = unit ? (UNIT_WORDS[unit] ?? unit) : '';
  return symbol ? `${String(value)} ${symbol}` : String(value);
}

/**
 * A value in a form's display unit (`0.0006` H in mH reads `0.6 mH`) with sensible digits.
 * @param valueSi - the SI value.
 * @param unit - the display unit.
 * @param digits - significant digits (default 6).
 * @returns the text with the unit symbol.
 */
export function formatInDisplayUnit(valueSi: number | null | undefined, unit: DisplayUnit, digits = 6): string {
  if (valueSi === null || valueSi === undefined || !Number.isFinite(valueSi)) return ABSENT;
  const text = formatNumber(valueSi / 10 ** unit.exponent, digits);
  return unit.symbol ? `${text} ${unit.symbol}` : text;
}

/**
 * A difference with its sign always written (`+0.013 Hz`, `−2.6 Hz`).
 * @param value - the difference.
 * @param unit - the unit keyword.
 * @param digits - significant digits (default 3).
 * @returns the signed text.
 */
export function formatSigned(value: number | null | undefined, unit: string | null, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return ABSENT;
  const body = formatQuantity(Math.abs(value), unit, digits);
  return `${value < 0 ? '−' : '+'}${body}`;
}

/**
 * A moment as the reader's local date and time (minutes).
 * @param iso - an ISO 8601 instant.
 * @returns e.g. `2 Dec 2026, 13:47`.
 */
export function formatDateTime(iso: string | null | undefined): string {
  if (!iso) return ABSENT;
  const t = new Date(iso);
  if (Number.isNaN(t.getTime())) return ABSENT;
  return t.toLocaleString(undefined, { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' });
}

/**
 * A day as the reader's local date.
 * @param iso - an ISO 8601 instant.
 * @returns e.g. `2 Dec 2026`.
 */
export function formatDate(iso: string | null | undefined): string {
  if (!iso) return ABSENT;
  const t = new Date(iso);
  if (Number.isNaN(t.getTime())) return ABSENT;
  return t.toLocaleDateString(undefined, { day: 'numeric', month: 'short', year: 'numeric' });
}

/**
 * A size in bytes in binary units (KiB, MiB).
 * @param bytes - the size.
 * @returns e.g. `167.9 KiB`.
 */
export function formatBytes(bytes: number): string {
  if (bytes < 1024) return `${bytes} B`;
  if (bytes < 1024 * 1024) return `${(bytes / 1024).toFixed(1)} KiB`;
  return `${(bytes / (1024 * 1024)).toFixed(1)} MiB`;
}

/**
 * Writes an SI value in a display unit for a form input: the shortest decimal of the double with
 * its point moved, so the text reads back to exactly the same double (showing a design never
 * changes it).
 * @param valueSi - the SI value (null = empty text).
 * @param unit - the display unit.
 * @returns the text for the input.
 */
export function formatInUnit(valueSi: number | null, unit: DisplayUnit): string {
  if (valueSi === null || !Number.isFinite(valueSi)) return '';
  if (valueSi === 0) return '0';
  const [mantissa, exp] = valueSi.toExponential().split('e');
  const negative = mantissa.startsWith('-');
  const digits = mantissa.replace('-', '').replace('.', '');
  const n = Number(exp) - unit.exponent;
  const sign = negative ? '-' : '';
  if (n < -6 || n > 20) return `${sign}${digits[0]}${digits.length > 1 ? `.${digits.slice(1)}` : ''}e${n}`;
  if (n < 0) return `${sign}0.${'0'.repeat(-n - 1)}${digits}`;
  const intPart = digits.slice(0, n + 1).padEnd(n + 1, '0');
  const frac = digits.slice(n + 1);
  return `${sign}${intPart}${frac ? `.${frac}` : ''}`;
}
