/**
 * Checks of the signals, sensing and limits of a design (CONTRACT section 7), in per-unit words:
 * a limit or sensing range that the rated operating point already exceeds is an `error`; the
 * headroom of each limit over the rated point is reported as `info`.
 */
import type { PlantSummary } from './plant';
import { perUnitBases, resolveSignals } from './signals';
import type { Check, DesignInput } from './types';

function pu(v: number): string {
  return Number(v.toPrecision(4)).toString();
}

/**
 * Limit, sensing, word-range and naming findings of a design.
 *
 * - `limits-current-reference`: the current reference clamp in pu of Ibase; below 1 pu the rated
 *   current cannot be commanded (`error`), else `info` with the headroom.
 * - `limits-modulation-index`: the modulation the rated point needs, m = sqrt(2) (V + w0 L I) / Vdc
 *   (plant summary, the converter voltage amplitude at rated current over the DC-link reference),
 *   against the clamp: above it `error`, within 5 % of it `warning`, else `info`.
 * - `limits-pll-frequency`: the PLL clamp in pu of the grid frequency; `error` when the grid
 *   frequency band of the envelope (when given) reaches beyond it.
 * - `signals-<quantity>-sense-range`: each sensor full scale in pu of its base; below 1 pu the rated
 *   point clips the ADC (`error`); a current full scale below the current limit: `warning`.
 * - `signals-word-range` (fixed arithmetic): every full scale must fit the signal word
 *   (+-2^(W-1-F) in the signal unit); `error` when one does not.
 * - `firmware-symbol-prefix`: `info` when no stable prefix is set (the C names then follow the
 *   display name and change with it).
 *
 * @param design - a validated design.
 * @param plant - the plant summary (rated current, minimum DC-link voltage of the modulator).
 * @returns the checks.
 * @example
 * limitChecks(sc3, plant.summary).find((c) => c.id === 'limits-current-reference')?.value; // => 1.2 (pu)
 */
export function limitChecks(design: DesignInput, plant: PlantSummary): Check[] {
  const r = resolveSignals(design);
  const b = perUnitBases(design);
  const checks: Check[] = [];
  const add = (check: Omit<Check, 'remedy'> & { remedy?: string | null }): void => {
    checks.push({ blockId: null, remedy: null, ...check });
  };

  const iLimitPu = r.currentReferencePeakA / b.currentBaseA;
  add({
    id: 'limits-current-reference',
    severity: iLimitPu < 1 ? 'error' : 'info',
    blockId: 'voltage-pi',
    message: iLimitPu < 1
      ? `The current reference clamp ${pu(iLimitPu)} pu (${pu(r.currentReferencePeakA)} A) is below the rated peak current (1 pu = ${pu(b.currentBaseA)} A): the rated operating point already exceeds it.`
      : `The current reference clamp is ${pu(iLimitPu)} pu (${pu(r.currentReferencePeakA)} A peak): ${pu(iLimitPu - 1)} pu of headroom over the rated peak current.`,
    value: iLimitPu, limit: 1, unit: 'pu',
    remedy: iLimitPu < 1 ? 'Raise the current reference limit to at least the rated peak current.' : null,
  });

  const mRated = plant.minimumDcLinkVoltageV / b.dcVoltageBaseV;
  const mMax = r.modulationIndexMax;
  const mSeverity = mRated > mMax ? 'error' : mRated > 0.95 * mMax ? 'warning' : 'info';
  add({
    id: 'limits-modulation-index',
    severity: mSeverity,
    blockId: 'current-pr',
    message: mRated > mMax
      ? `At rated current the converter needs a modulation index of ${pu(mRated)} (${pu(plant.minimumDcLinkVoltageV)} V on a ${pu(b.dcVoltageBaseV)} V link), above the clamp ${pu(mMax)}: the rated operating point already exceeds it.`
      : `At rated current the converter needs a modulation index of ${pu(mRated)}; the clamp ${pu(mMax)} leaves ${pu(mMax - mRated)} of headroom.`,
    value: mRated, limit: mMax, unit: 'pu',
    remedy: mSeverity === 'info' ? null : 'Raise the DC-link voltage reference or the modulation limit, or lower the filter inductance.',
  });

  const f0 = design.grid.frequencyHz;
  const band = design.envelope?.gridFrequencyHz;
  const bandDeviationHz = band ? Math.max(f0 - band[0], band[1] - f0) : 0;
  const clampPu = r.pllFrequencyDeviationHz / f0;
  const bandBeyond = bandDeviationHz > r.pllFrequencyDeviationHz;
  add({
    id: 'limits-pll-frequency',
    severity: bandBeyond ? 'error' : 'info',
    blockId: 'pll-pi',
    message: bandBeyond
      ? `The PLL frequency clamp +-${pu(clampPu)} pu (+-${pu(r.pllFrequencyDeviationHz)} Hz) is narrower than the grid-frequency band the unit must ride through (+-${pu(bandDeviationHz / f0)} pu).`
      : `The PLL frequency clamp is +-${pu(clampPu)} pu (+-${pu(r.pllFrequencyDeviationHz)} Hz around ${f0} Hz)${band ? `, ${pu((r.pllFrequencyDeviationHz - bandDeviationHz) / f0)} pu beyond the ride-through band` : ''}.`,
    value: clampPu, limit: bandDeviationHz / f0, unit: 'pu',
    remedy: bandBeyond ? 'Widen the PLL frequency limit to cover the grid-frequency band.' : null,
  });

  const sensors: [string, string, number, number, string][] = [
    ['current', 'current', r.currentSenseFullScaleA, b.currentBaseA, 'A'],
    ['grid-voltage', 'grid-voltage', r.gridVoltageSenseFullScaleV, b.voltageBaseV, 'V'],
    ['dc-voltage', 'DC-link voltage', r.dcVoltageSenseFullScaleV, b.dcVoltageBaseV, 'V'],
  ];
  for (const [id, name, fullScale, base, unit] of sensors) {
    const fsPu = fullScale / base;
    const belowLimit = id === 'current' && fsPu >= 1 && fullScale < r.currentReferencePeakA;
    const severity = fsPu < 1 ? 'error' : belowLimit ? 'warning' : 'info';
    add({
      id: `signals-${id}-sense-range`,
      severity,
      message: fsPu < 1
        ? `The ${name} sensor reaches full scale at ${pu(fsPu)} pu (${pu(fullScale)} ${unit}): the rated operating point (1 pu = ${pu(base)} ${unit}) already clips the ADC.`
        : belowLimit
          ? `The current sensor reaches full scale at ${pu(fsPu)} pu, below the current reference clamp (${pu(iLimitPu)} pu): the ADC clips before the limit acts.`
          : `The ${name} sensor reaches full scale at ${pu(fsPu)} pu (${pu(fullScale)} ${unit}): ${pu(fsPu - 1)} pu of headroom over the rated peak.`,
      value: fsPu, limit: id === 'current' ? Math.max(1, iLimitPu) : 1, unit: 'pu',
      remedy: severity === 'info' ? null : `Raise the ${name} sense full scale.`,
    });
  }

  if (r.arithmetic === 'fixed') {
    const rangeSignal = 2 ** (r.wordBits - 1 - r.signalFracBits);
    const perUnit = r.units === 'per-unit';
    const inSignal: [string, number][] = [
      ['current sense full scale', r.currentSenseFullScaleA / (perUnit ? b.currentBaseA : 1)],
      ['grid-voltage sense full scale', r.gridVoltageSenseFullScaleV / (perUnit ? b.voltageBaseV : 1)],
      ['DC-link sense full scale', r.dcVoltageSenseFullScaleV / (perUnit ? b.dcVoltageBaseV : 1)],
    ];
    const [worstName, worst] = inSignal.reduce((p, q) => (q[1] > p[1] ? q : p));
    const fits = worst < rangeSignal;
    const unitWord = perUnit ? 'pu' : 'A or V';
    add({
      id: 'signals-word-range',
      severity: fits ? 'info' : 'error',
      message: fits
        ? `The ${r.signalFormat} signal word spans +-${pu(rangeSignal)} ${unitWord}; the largest sensed value (${worstName}, ${pu(worst)} ${unitWord}) fits with ${pu(rangeSignal / worst)} x room.`
        : `The ${worstName} (${pu(worst)} ${unitWord}) does not fit the ${r.signalFormat} signal word (+-${pu(rangeSignal)} ${unitWord}).`,
      value: worst, limit: rangeSignal, unit: perUnit ? 'pu' : null,
      remedy: fits ? null : 'Use fewer signal fraction bits, or per-unit signals.',
    });
  }

  if (r.symbolPrefix === null) {
    add({
      id: 'firmware-symbol-prefix',
      severity: 'info',
      message: 'No firmware symbol prefix is set: the exported C names derive from the display name and change when the design is renamed.',
      value: null, limit: null, unit: null,
      remedy: 'Set a firmware symbol prefix so call sites survive a rename.',
    });
  }
  return checks;
}
