// The form's texts and the design file: display units in, SI out.
import { describe, expect, it } from 'vitest';
import { designToTexts, readDesignTexts, signalDefaultTexts } from '../../../src/composables/designFields';
import { parseDesign } from '../../../shared/api/design';
import { newDesignTemplate } from '../../../src/stores/designs';
import { expectClose } from '../../helpers/expectClose';

describe('design texts', () => {
  const design = newDesignTemplate('Bay 4 rig');

  it('shows SI values in engineering units', () => {
    const texts = designToTexts(design);
    expect(texts.values['filter.inductanceH']).toBe('0.6');
    expect(texts.values['filter.resistanceOhm']).toBe('30');
    expect(texts.values['dcLink.capacitanceF']).toBe('2200');
    expect(texts.values['sampling.switchingFrequencyHz']).toBe('20');
    expect(texts.values['rating.apparentPowerVA']).toBe('3.3');
    expect(texts.values['pll.settlingTimeS']).toBe('60');
    expect(texts.values['currentLoop.kp']).toBe('');
    expect(texts.harmonics).toBe('1, 3, 5, 7');
    expect(texts.resonantGains).toEqual(['', '', '', '']);
  });

  it('reads the texts back to the same SI design', () => {
    const { candidate, errors } = readDesignTexts(designToTexts(design));
    expect(errors).toEqual({});
    const c = candidate as unknown as typeof design;
    expectClose(c.filter.topology === 'L' ? c.filter.inductanceH : NaN, 6e-4, { rtol: 1e-12 });
    expectClose(c.dcLink.capacitanceF, 2.2e-3, { rtol: 1e-12 });
    expectClose(c.sampling.switchingFrequencyHz, 20000, { rtol: 1e-12 });
    expectClose(c.pll.sogiGain, Math.SQRT2, { rtol: 1e-9 });
    expect(c.currentLoop.kp).toBeNull();
    expect(c.currentLoop.resonantGains).toBeNull();
    expect(c.currentLoop.harmonics).toEqual([1, 3, 5, 7]);
    expect(c.fixedPoint.wordBits).toBe(32);
  });

  it('shows a long stored value shortened and keeps it exact until the text is edited', () => {
    const texts = designToTexts(design);
    // sqrt(2) = 1.4142135623730951 is shown to six digits ...
    expect(texts.values['pll.sogiGain']).toBe('1.41421');
    // ... and reads back bit-exact while untouched (so showing a design never changes it),
    expect((readDesignTexts(texts).candidate as unknown as typeof design).pll.sogiGain).toBe(Math.SQRT2);
    // while a typed value is taken as typed.
    texts.values['pll.sogiGain'] = '1.5';
    expect((readDesignTexts(texts).candidate as unknown as typeof design).pll.sogiGain).toBe(1.5);
  });

  it('accepts typed units other than the displayed one', () => {
    const texts = designToTexts(design);
    texts.values['filter.inductanceH'] = '450 µH';
    texts.values['sampling.switchingFrequencyHz'] = '16000 Hz';
    const c = readDesignTexts(texts).candidate as unknown as typeof design;
    expectClose(c.filter.topology === 'L' ? c.filter.inductanceH : NaN, 4.5e-4, { rtol: 1e-12 });
    expectClose(c.sampling.switchingFrequencyHz, 16000, { rtol: 1e-12 });
  });

  it('turns a typed gain into an override and blank back into null', () => {
    const texts = designToTexts(design);
    texts.values['currentLoop.kp'] = '3.5';
    expect((readDesignTexts(texts).candidate as unknown as typeof design).currentLoop.kp).toBe(3.5);
    texts.values['currentLoop.kp'] = '';
    expect((readDesignTexts(texts).candidate as unknown as typeof design).currentLoop.kp).toBeNull();
  });

  it('asks for every resonant gain once one is given', () => {
    const texts = designToTexts(design);
    texts.resonantGains = ['120', '', '', ''];
    const { errors } = readDesignTexts(texts);
    expect(errors['currentLoop.resonantGains.1']).toContain('every resonant gain or none');
    expect(errors['currentLoop.resonantGains.0']).toBeUndefined();
  });

  it('names the field of unreadable text and of a missing required value', () => {
    const texts = designToTexts(design);
    texts.values['filter.inductanceH'] = 'six';
    texts.values['grid.voltageRmsV'] = '';
    texts.harmonics = '1, 2.5';
    const { errors } = readDesignTexts(texts);
    expect(errors['filter.inductanceH']).toContain('not a number');
    expect(errors['grid.voltageRmsV']).toBe('Required.');
    expect(errors['currentLoop.harmonics']).toContain('whole numbers');
  });

  it('reads only the fields of the chosen topology', () => {
    const texts = designToTexts(design);
    texts.topology = 'LCL';
    Object.assign(texts.values, { 'filter.inverterInductanceH': '0.4', 'filter.gridInductanceH': '0.2', 'filter.capacitanceF': '4.7', 'filter.dampingResistanceOhm': '1.5' });
    const { candidate, errors } = readDesignTexts(texts);
    expect(errors).toEqual({});
    const filter = (candidate as { filter: Record<string, unknown> }).filter;
    expect(filter.topology).toBe('LCL');
    expect(filter.inductanceH).toBeUndefined();
    expectClose(filter.capacitanceF as number, 4.7e-6, { rtol: 1e-12 });
  });
});

describe('signals and limits (CONTRACT section 7)', () => {
  const full = () => ({
    ...newDesignTemplate('Bay 5 rig'),
    signals: { units: 'per-unit' as const, signalFracBits: 28, currentSenseFullScaleA: 40, adcBits: 14 },
    limits: { currentReferencePeakA: 45, pllFrequencyDeviationHz: 4 },
    firmware: { symbolPrefix: 'BAY5' },
    envelope: { shortCircuitRatioMin: 5, gridFrequencyHz: [59.3, 60.5] as [number, number] },
    fixedPoint: { wordBits: 32 as const, arithmetic: 'float32' as const, structure: 'quantization-robust' as const },
  });

  it('editing keeps every section, shown or not (units, signal fraction bits, envelope)', () => {
    const design = full();
    const texts = designToTexts(design);
    expect(texts.values['signals.currentSenseFullScaleA']).toBe('40');
    expect(texts.symbolPrefix).toBe('BAY5');
    texts.values['grid.voltageRmsV'] = '121';
    const { candidate, errors } = readDesignTexts(texts);
    expect(errors).toEqual({});
    const parsed = parseDesign(candidate);
    expect(parsed.ok, JSON.stringify(parsed)).toBe(true);
    const got = (parsed as { ok: true; design: typeof design }).design;
    expect(got.signals).toEqual(design.signals);
    expect(got.limits).toEqual(design.limits);
    expect(got.firmware).toEqual(design.firmware);
    expect(got.envelope).toEqual(design.envelope);
    expect(got.fixedPoint).toEqual(design.fixedPoint);
    expect(got.grid.voltageRmsV).toBe(121);
  });

  it('a design without the sections reads back without them; typed values add keys in SI, blanks remove them', () => {
    const plain = newDesignTemplate('Bay 6 rig');
    const texts = designToTexts(plain);
    const back = readDesignTexts(texts).candidate;
    for (const key of ['signals', 'limits', 'firmware', 'envelope']) expect(back).not.toHaveProperty(key);
    expect((back as { fixedPoint: object }).fixedPoint).toEqual({ wordBits: 32 });
    texts.values['signals.currentSenseFullScaleA'] = '0.05 kA';
    texts.values['limits.modulationIndexMax'] = '92 %';
    texts.symbolPrefix = ' BAY6 ';
    const typed = readDesignTexts(texts).candidate as { signals: Record<string, number>; limits: Record<string, number>; firmware: Record<string, string> };
    expect(typed.signals).toEqual({ currentSenseFullScaleA: 50 });
    expectClose(typed.limits.modulationIndexMax, 0.92, { rtol: 1e-15 });
    expect(typed.firmware).toEqual({ symbolPrefix: 'BAY6' });
    texts.values['signals.currentSenseFullScaleA'] = '';
    texts.values['limits.modulationIndexMax'] = '';
    texts.symbolPrefix = '';
    const cleared = readDesignTexts(texts).candidate;
    for (const key of ['signals', 'limits', 'firmware']) expect(cleared).not.toHaveProperty(key);
  });

  it('shows the documented defaults of the plant as typed: 2 x and 1.2 x the rated peak current, 100 MHz / (2 fsw) counts', () => {
    const texts = designToTexts(newDesignTemplate('Bay 7 rig'));
    // 3.3 kVA at 120 V: Ibase = sqrt(2) 3300 / 120 = 38.89 A (hand arithmetic)
    const defaults = signalDefaultTexts(readDesignTexts(texts).candidate);
    expect(defaults['signals.currentSenseFullScaleA']).toBe('77.78');
    expect(defaults['limits.currentReferencePeakA']).toBe('46.67');
    expect(defaults['signals.pwmCarrierCounts']).toBe('2500');
    expect(defaults['signals.adcBits']).toBe('12');
    expect(defaults['limits.pllFrequencyDeviationHz']).toBe('6');
    texts.values['rating.apparentPowerVA'] = '6.6';
    expect(signalDefaultTexts(readDesignTexts(texts).candidate)['signals.currentSenseFullScaleA']).toBe('155.6');
    texts.values['grid.voltageRmsV'] = 'x';
    expect(signalDefaultTexts(readDesignTexts(texts).candidate)['signals.currentSenseFullScaleA']).toBeUndefined();
  });
});
