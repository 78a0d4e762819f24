/**
 * Published harmonic-current limits the user picks from, and the comparison of a simulated grid
 * current with them.
 *
 * The values are from memory and must be checked against the standards before a compliance claim:
 * - IEEE Std 519-2014, table 2, current distortion limits for systems rated 120 V through 69 kV,
 *   in percent of the maximum demand load current I_L, by the ratio I_sc / I_L at the point of
 *   common coupling; even harmonics limited to 25 % of the odd-harmonic limits (from memory).
 * - IEC 61000-3-2 (class A equipment), maximum harmonic currents in A rms, for equipment with an
 *   input current up to 16 A per phase on 220-240 V systems (from memory).
 */

/** Which table the harmonics are compared with. */
export type HarmonicTable = 'ieee-519' | 'iec-61000-3-2-class-a';

/** One row of IEEE 519-2014 table 2 (from memory): limits in percent of I_L. */
interface Ieee519Row {
  /** Row applies when I_sc / I_L is below this (Infinity for the last row). */
  ratioBelow: number;
  label: string;
  /** Odd-harmonic limits for 3 <= h < 11, 11 <= h < 17, 17 <= h < 23, 23 <= h < 35, 35 <= h <= 50. */
  odd: [number, number, number, number, number];
  /** Total demand distortion limit, percent. */
  tddPercent: number;
}

/** IEEE Std 519-2014 table 2, current distortion limits, 120 V to 69 kV (from memory). */
export const IEEE_519_ROWS: readonly Ieee519Row[] = [
  { ratioBelow: 20, label: 'Isc/IL < 20', odd: [4.0, 2.0, 1.5, 0.6, 0.3], tddPercent: 5.0 },
  { ratioBelow: 50, label: '20 <= Isc/IL < 50', odd: [7.0, 3.5, 2.5, 1.0, 0.5], tddPercent: 8.0 },
  { ratioBelow: 100, label: '50 <= Isc/IL < 100', odd: [10.0, 4.5, 4.0, 1.5, 0.7], tddPercent: 12.0 },
  { ratioBelow: 1000, label: '100 <= Isc/IL < 1000', odd: [12.0, 5.5, 5.0, 2.0, 1.0], tddPercent: 15.0 },
  { ratioBelow: Infinity, label: 'Isc/IL >= 1000', odd: [15.0, 7.0, 6.0, 2.5, 1.4], tddPercent: 20.0 },
];

/** IEEE 519-2014: even harmonics are limited to this fraction of the odd-harmonic limit of their range (from memory). */
export const IEEE_519_EVEN_FRACTION = 0.25;

/** IEC 61000-3-2 class A: limits of the low orders in A rms (from memory). */
export const IEC_61000_3_2_CLASS_A_A: Readonly<Record<number, number>> = {
  2: 1.08, 3: 2.3, 4: 0.43, 5: 1.14, 6: 0.3, 7: 0.77, 9: 0.4, 11: 0.33, 13: 0.21,
};

/** IEC 61000-3-2 applies to equipment drawing up to this current per phase, A rms (from memory). */
export const IEC_61000_3_2_CURRENT_MAX_A = 16;

/** Highest order each table limits. */
export const HARMONIC_TABLE_MAX_ORDER: Readonly<Record<HarmonicTable, number>> = { 'ieee-519': 50, 'iec-61000-3-2-class-a': 40 };

/**
 * IEEE 519-2014 limit of one harmonic order, percent of I_L (from memory).
 *
 * @param harmonic - order h, 2 to 50.
 * @param row - the table row of the I_sc / I_L ratio.
 * @returns the limit in percent.
 * @example
 * ieee519LimitPercent(5, IEEE_519_ROWS[0]); // => 4
 * ieee519LimitPercent(4, IEEE_519_ROWS[0]); // => 1 (25 % of 4)
 */
export function ieee519LimitPercent(harmonic: number, row: Ieee519Row): number {
  const h = harmonic;
  const band = h < 11 ? 0 : h < 17 ? 1 : h < 23 ? 2 : h < 35 ? 3 : 4;
  const odd = row.odd[band];
  return h % 2 === 0 ? IEEE_519_EVEN_FRACTION * odd : odd;
}

/**
 * IEC 61000-3-2 class A limit of one order, A rms (from memory): the listed low orders, then
 * odd 15 <= h <= 39: 0.15 x 15 / h, even 8 <= h <= 40: 0.23 x 8 / h; null above 40 or for order 1.
 *
 * @param harmonic - order h.
 * @returns the limit in A rms, or null when the table sets none.
 * @example
 * iecClassALimitA(3); // => 2.3
 * iecClassALimitA(21); // => 0.1071
 */
export function iecClassALimitA(harmonic: number): number | null {
  const h = harmonic;
  if (h < 2 || h > 40) return null;
  const listed = IEC_61000_3_2_CLASS_A_A[h];
  if (listed !== undefined) return listed;
  if (h % 2 === 1) return h >= 15 && h <= 39 ? (0.15 * 15) / h : null;
  return h >= 8 ? (0.23 * 8) / h : null;
}

/** One harmonic against its limit. */
export interface HarmonicLimitRow {
  harmonic: number;
  /** Simulated amplitude as percent of the fundamental. */
  valuePercent: number;
  /** Simulated rms current, A. */
  valueRmsA: number;
  /** Limit in percent of I_L (IEEE 519), or null. */
  limitPercent: number | null;
  /** Limit in A rms (IEC 61000-3-2), or null. */
  limitRmsA: number | null;
  pass: boolean;
}

/** A simulated grid current compared with a table. */
export interface HarmonicLimitResult {
  table: HarmonicTable;
  /** Which row or class applied, e.g. `Isc/IL >= 1000`. */
  basis: string;
  /** I_sc / I_L at the PCC, null on a stiff grid (infinite). */
  shortCircuitToLoadRatio: number | null;
  rows: HarmonicLimitRow[];
  /** THD (= TDD with I_L taken as the simulated fundamental) against the table's TDD limit, percent. */
  distortion: { valuePercent: number | null; limitPercent: number | null; pass: boolean | null };
  pass: boolean;
  /** Assumptions and scope notes, one sentence each. */
  notes: string[];
}

/**
 * Compares grid-current harmonics with the chosen table.
 *
 * I_L (IEEE 519) is taken as the simulated fundamental grid current, so the percentages are those
 * of the fundamental and TDD equals THD at this operating point. I_sc = V / (w L_g).
 *
 * @param table - the table.
 * @param amplitudesA - |c_h| peak amplitudes of the grid current, A, index = order (0..50).
 * @param thd - THD of the same current, percent (null without a fundamental).
 * @param shortCircuitCurrentRmsA - I_sc at the PCC, A rms; null for a stiff grid.
 * @returns the comparison.
 * @example
 * compareHarmonics('ieee-519', amplitudes, 2.1, null).basis; // => 'Isc/IL >= 1000'
 */
export function compareHarmonics(table: HarmonicTable, amplitudesA: ArrayLike<number>, thd: number | null, shortCircuitCurrentRmsA: number | null): HarmonicLimitResult {
  const fundamental = amplitudesA[1];
  const notes: string[] = [];
  const rows: HarmonicLimitRow[] = [];
  const maxOrder = Math.min(HARMONIC_TABLE_MAX_ORDER[table], amplitudesA.length - 1);
  const fundamentalRms = fundamental / Math.SQRT2;
  const ratio = shortCircuitCurrentRmsA === null || !(fundamentalRms > 0) ? null : shortCircuitCurrentRmsA / fundamentalRms;
  let basis: string;
  let distortionLimit: number | null = null;
  if (table === 'ieee-519') {
    const row = IEEE_519_ROWS.find((r) => (ratio === null ? Infinity : ratio) < r.ratioBelow) ?? IEEE_519_ROWS[IEEE_519_ROWS.length - 1];
    basis = row.label;
    distortionLimit = row.tddPercent;
    notes.push('IEEE Std 519-2014 table 2 limits are quoted from memory: check them against the standard before a compliance claim.');
    notes.push('I_L is taken as the simulated fundamental grid current, so TDD equals THD at this operating point.');
    for (let h = 2; h <= maxOrder; h++) {
      const valuePercent = fundamental > 0 ? (100 * amplitudesA[h]) / fundamental : 0;
      const limitPercent = ieee519LimitPercent(h, row);
      rows.push({ harmonic: h, valuePercent, valueRmsA: amplitudesA[h] / Math.SQRT2, limitPercent, limitRmsA: null, pass: valuePercent <= limitPercent });
    }
  } else {
    basis = 'class A';
    notes.push('IEC 61000-3-2 class A limits are quoted from memory: check them against the standard before a compliance claim.');
    if (fundamentalRms > IEC_61000_3_2_CURRENT_MAX_A) {
      notes.push(`The fundamental grid current (${fundamentalRms.toFixed(1)} A rms) exceeds the ${IEC_61000_3_2_CURRENT_MAX_A} A per phase the standard covers; the comparison is indicative only.`);
    }
    for (let h = 2; h <= maxOrder; h++) {
      const valueRmsA = amplitudesA[h] / Math.SQRT2;
      const limitRmsA = iecClassALimitA(h);
      if (limitRmsA === null) continue;
      const valuePercent = fundamental > 0 ? (100 * amplitudesA[h]) / fundamental : 0;
      rows.push({ harmonic: h, valuePercent, valueRmsA, limitPercent: null, limitRmsA, pass: valueRmsA <= limitRmsA });
    }
  }
  const distortionPass = thd === null || distortionLimit === null ? null : thd <= distortionLimit;
  return {
    table,
    basis,
    shortCircuitToLoadRatio: ratio,
    rows,
    distortion: { valuePercent: thd, limitPercent: distortionLimit, pass: distortionPass },
    pass: rows.every((r) => r.pass) && distortionPass !== false,
    notes,
  };
}
