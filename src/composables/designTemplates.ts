// Starting designs for "New design": blank, rating-driven defaults sized by the published rules
// (the arithmetic is in the core, shared/control/filterSizing.ts), each sized value with the rule
// beside it; or a copy of an existing design.
import {
  baseImpedanceOhm, dcLinkCapacitanceForRippleF, inductanceForDropH, SIZING_INDUCTOR_DROP, startingLcl,
  type DesignInput, type SizingRating,
} from '../../shared/control';
import { formatInDisplayUnit, formatQuantity, type DisplayUnit } from './format';

/** What the user picks for a blank design. */
export interface RatingChoice extends SizingRating {
  switchingFrequencyHz: number;
  topology: 'L' | 'LCL';
}

/** One sized value with the rule that gave it. */
export interface SizedValue {
  label: string;
  /** The value as shown, in the form's unit. */
  text: string;
  /** The rule, named. */
  rule: string;
}

/** A rating-driven starting design. */
export interface RatedTemplate {
  design: DesignInput | null;
  sized: SizedValue[];
  /** Why no design could be sized (null when it could). */
  problem: string | null;
}

/** Peak DC-link ripple the template allows, fraction of the DC-link voltage (common practice, no source). */
export const TEMPLATE_RIPPLE_FRACTION = 0.03;
/** DC-link voltage over the grid peak in the template (modulator headroom; common practice, no source). */
export const TEMPLATE_DC_LINK_OVER_PEAK = 1.2;
/** Series resistance of the filter inductors in the template, fraction of the base impedance (a typical estimate; common practice, no source). */
export const TEMPLATE_RESISTANCE_FRACTION = 0.005;
/** Current-loop crossover over the sampling rate: fs/20 gives about 60° with one sample of delay (common practice, no source). */
export const TEMPLATE_CROSSOVER_OF_SAMPLE_RATE = 1 / 20;
/** The same for an LCL filter, lower to keep the margins with its resonance (common practice, no source). */
export const TEMPLATE_LCL_CROSSOVER_OF_SAMPLE_RATE = 1 / 40;
/** DC-link voltage-loop crossover over the grid frequency: low enough that the 2 f0 ripple makes under 4 % third harmonic (common practice, no source). */
export const TEMPLATE_VOLTAGE_CROSSOVER_OF_GRID = 0.15;

const mH: DisplayUnit = { symbol: 'mH', exponent: -3 };
const uF: DisplayUnit = { symbol: 'µF', exponent: -6 };
const ohm: DisplayUnit = { symbol: 'Ω', exponent: 0 };

/**
 * Rounds to three significant digits, downwards when asked (a capacitor must stay within its limit).
 * @param value - a positive value.
 * @param mode - `nearest` or `down`.
 * @returns the rounded value.
 */
export function roundSignificant(value: number, mode: 'nearest' | 'down' = 'nearest'): number {
  const scale = 10 ** (Math.floor(Math.log10(Math.abs(value))) - 2);
  const n = value / scale;
  const rounded = mode === 'down' ? Math.floor(n + 1e-9) : Math.round(n);
  return Number((rounded * scale).toPrecision(3));
}

/**
 * A blank design sized from its rating: the filter by the 5 % drop rule (L) or the LCL rules,
 * the DC link for 5 % ripple, the loops from the sampling rate, every gain designed by rule.
 * @param name - the design's name.
 * @param choice - grid, rating, switching frequency and topology.
 * @returns the design, the sized values with their rules, or the reason it cannot be sized.
 */
export function ratedTemplate(name: string, choice: RatingChoice): RatedTemplate {
  const rating: SizingRating = { voltageRmsV: choice.voltageRmsV, frequencyHz: choice.frequencyHz, apparentPowerVA: choice.apparentPowerVA };
  const sampleRateHz = choice.switchingFrequencyHz;
  const f0 = choice.frequencyHz;
  const sized: SizedValue[] = [];
  const zb = baseImpedanceOhm(rating);
  const resistanceOhm = roundSignificant(TEMPLATE_RESISTANCE_FRACTION * zb);
  let filter: DesignInput['filter'];
  if (choice.topology === 'L') {
    const l = roundSignificant(inductanceForDropH(rating, SIZING_INDUCTOR_DROP));
    filter = { topology: 'L', inductanceH: l, resistanceOhm };
    sized.push({ label: 'Inductance', text: formatInDisplayUnit(l, mH, 3), rule: 'drop at rated current 5 % of grid voltage (usual rule of thumb)' });
  } else {
    const lcl = startingLcl(rating, sampleRateHz);
    if (!lcl) return { design: null, sized, problem: `No LCL split places the resonance below half the sampling rate (${formatQuantity(sampleRateHz / 2, 'Hz')}): raise the switching frequency.` };
    const l1 = roundSignificant(lcl.inverterInductanceH);
    const l2 = roundSignificant(lcl.gridInductanceH);
    const cf = roundSignificant(lcl.capacitanceF, 'down');
    const rd = roundSignificant(lcl.dampingResistanceOhm);
    filter = { topology: 'LCL', inverterInductanceH: l1, gridInductanceH: l2, capacitanceF: cf, dampingResistanceOhm: rd, resistanceOhm };
    const [lo, hi] = lcl.resonanceWindowHz;
    sized.push(
      { label: 'L1 + L2', text: formatInDisplayUnit(l1 + l2, mH, 3), rule: 'drop at rated current 5 % of grid voltage (usual rule of thumb)' },
      { label: 'Filter capacitance Cf', text: formatInDisplayUnit(cf, uF, 3), rule: 'reactive power at most 5 % of the rating (Liserre, Blaabjerg & Hansen, IEEE TIA 2005)' },
      { label: 'Inverter-side L1', text: formatInDisplayUnit(l1, mH, 3), rule: `split placing the resonance at ${formatQuantity(lcl.resonanceHz, 'Hz', 3)}, between ${formatQuantity(lo, 'Hz', 3)} (10 × grid) and ${formatQuantity(hi, 'Hz', 3)} (half the sampling rate), same source` },
      { label: 'Grid-side L2', text: formatInDisplayUnit(l2, mH, 3), rule: 'the rest of L1 + L2 (the smaller inductor on the grid side)' },
      { label: 'Damping resistance Rd', text: formatInDisplayUnit(rd, ohm, 3), rule: 'a third of the capacitor impedance at resonance (same source)' },
    );
  }
  sized.push({ label: 'Series resistance', text: formatInDisplayUnit(resistanceOhm, { symbol: 'mΩ', exponent: -3 }, 3), rule: 'estimate: 0.5 % of the base impedance V²/S; put in the measured value' });
  const voltageRefV = Math.ceil((TEMPLATE_DC_LINK_OVER_PEAK * Math.SQRT2 * choice.voltageRmsV) / 10) * 10;
  const capacitanceF = roundSignificant(dcLinkCapacitanceForRippleF(rating, voltageRefV, TEMPLATE_RIPPLE_FRACTION * voltageRefV));
  sized.push(
    { label: 'DC-link voltage reference', text: `${voltageRefV} V`, rule: '1.2 × the grid peak, rounded up to 10 V (modulator headroom)' },
    { label: 'DC-link capacitance', text: formatInDisplayUnit(capacitanceF, uF, 3), rule: `ripple at ${2 * f0} Hz of 3 % of the DC-link voltage, C = S / (2 ω Vdc ΔV) (Kjaer, Pedersen & Blaabjerg, IEEE TIA 2005)` },
  );
  const crossoverHz = roundSignificant((choice.topology === 'LCL' ? TEMPLATE_LCL_CROSSOVER_OF_SAMPLE_RATE : TEMPLATE_CROSSOVER_OF_SAMPLE_RATE) * sampleRateHz);
  const harmonics = [1, 3, 5, 7].filter((h) => h * f0 < crossoverHz && h * f0 < sampleRateHz / 2);
  const voltageCrossoverHz = roundSignificant(Math.min(TEMPLATE_VOLTAGE_CROSSOVER_OF_GRID * f0, crossoverHz / 10));
  const design: DesignInput = {
    format: 'varsmith-design/1',
    name,
    grid: { voltageRmsV: choice.voltageRmsV, frequencyHz: f0 },
    rating: { apparentPowerVA: choice.apparentPowerVA },
    filter,
    dcLink: { capacitanceF, voltageRefV },
    sampling: { switchingFrequencyHz: choice.switchingFrequencyHz, updatesPerCarrier: 1, computationDelaySamples: 1 },
    currentLoop: { crossoverHz, harmonics: harmonics.length ? harmonics : [1], resonantBandwidthHz: 0.5, kp: null, resonantGains: null },
    voltageLoop: { crossoverHz: voltageCrossoverHz, phaseMarginDeg: 60, kp: null, ki: null },
    pll: { sogiGain: Math.SQRT2, settlingTimeS: 0.06, dampingRatio: 0.7071, kp: null, ki: null },
    reactiveFilter: { order: 2, cutoffHz: 10 },
    fixedPoint: { wordBits: 32 },
  };
  sized.push({
    label: 'Current-loop crossover', text: formatQuantity(crossoverHz, 'Hz', 3),
    rule: choice.topology === 'LCL' ? 'a fortieth of the sampling rate, clear of the LCL resonance' : 'a twentieth of the sampling rate: about 60° of phase margin with one sample of delay',
  });
  return { design, sized, problem: null };
}

/**
 * A copy of an existing design under a new name (every value kept).
 * @param source - the design to copy.
 * @param name - the new name.
 * @returns a new design object.
 */
export function copiedTemplate(source: DesignInput, name: string): DesignInput {
  return { ...(JSON.parse(JSON.stringify(source)) as DesignInput), name };
}
