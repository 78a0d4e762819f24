// Rating-driven starting designs: every sized value names its rule, and the design the rules give
// passes the same analysis the workspace runs with no error and no warning (a blank design must
// not open with findings) over a spread of grids, ratings and switching frequencies.
import { describe, expect, it } from 'vitest';
import { analyzeDesign, lclResonanceHz } from '../../../shared/control';
import { parseDesign } from '../../../shared/api/design';
import { copiedTemplate, ratedTemplate, roundSignificant, type RatingChoice } from '../../../src/composables/designTemplates';
import { newDesignTemplate } from '../../../src/stores/designs';

const choices: RatingChoice[] = [];
for (const topology of ['L', 'LCL'] as const) {
  for (const [voltageRmsV, frequencyHz] of [[120, 60], [230, 50], [240, 60]]) {
    for (const apparentPowerVA of [1000, 5000]) {
      for (const switchingFrequencyHz of [10000, 20000]) choices.push({ topology, voltageRmsV, frequencyHz, apparentPowerVA, switchingFrequencyHz });
    }
  }
}

describe('rating-driven starting designs', () => {
  it.each(choices.map((c) => [`${c.topology} ${c.voltageRmsV} V ${c.frequencyHz} Hz ${c.apparentPowerVA} VA ${c.switchingFrequencyHz} Hz`, c] as const))('%s: valid, no error or warning', (_name, choice) => {
    const template = ratedTemplate('Starter', choice);
    expect(template.problem).toBeNull();
    const parsed = parseDesign(template.design);
    expect(parsed.ok).toBe(true);
    const serious = analyzeDesign(template.design!, { sweepPoints: 0, responseSamples: 0 }).checks.filter((c) => c.severity !== 'info');
    expect(serious.map((c) => `${c.id}: ${c.message}`)).toEqual([]);
  });

  it('names the rule beside each LCL value and keeps the capacitor within 5 % after rounding', () => {
    const template = ratedTemplate('Starter', { topology: 'LCL', voltageRmsV: 240, frequencyHz: 60, apparentPowerVA: 5000, switchingFrequencyHz: 16000 });
    const rules = template.sized.map((s) => `${s.label}: ${s.rule}`).join('\n');
    expect(rules).toContain('Filter capacitance Cf: reactive power at most 5 % of the rating (Liserre, Blaabjerg & Hansen, IEEE TIA 2005)');
    expect(rules).toContain('L1 + L2: drop at rated current 5 % of grid voltage');
    const filter = template.design!.filter;
    if (filter.topology !== 'LCL') throw new Error('expected an LCL filter');
    // Liserre, Blaabjerg & Hansen 2005: w0 Cf V^2 <= 5 % of S, resonance in (10 f0, fs/2).
    expect((2 * Math.PI * 60 * filter.capacitanceF * 240 ** 2) / 5000).toBeLessThanOrEqual(0.05);
    const fres = lclResonanceHz(filter.inverterInductanceH, filter.gridInductanceH, filter.capacitanceF);
    expect(fres).toBeGreaterThan(600);
    expect(fres).toBeLessThan(8000);
  });

  it('says why when the sampling rate is too low to place an LCL resonance', () => {
    const template = ratedTemplate('Starter', { topology: 'LCL', voltageRmsV: 120, frequencyHz: 60, apparentPowerVA: 3300, switchingFrequencyHz: 4000 });
    expect(template.design).toBeNull();
    expect(template.problem).toContain('half the sampling rate');
  });

  it('rounds to three significant digits, downwards when asked', () => {
    expect(roundSignificant(3.0389e-5)).toBe(3.04e-5);
    expect(roundSignificant(3.0389e-5, 'down')).toBe(3.03e-5);
    expect(roundSignificant(578.75)).toBe(579);
  });

  it('copies an existing design under the new name, values untouched and not shared', () => {
    const source = newDesignTemplate('Quay 2');
    const copy = copiedTemplate(source, 'Quay 3');
    expect(copy.name).toBe('Quay 3');
    expect({ ...copy, name: 'Quay 2' }).toEqual(source);
    copy.grid.voltageRmsV = 230;
    expect(source.grid.voltageRmsV).toBe(120);
  });
});
