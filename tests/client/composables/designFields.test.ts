// The form's texts and the design file: display units in, SI out.
import { describe, expect, it } from 'vitest';
import { designToTexts, readDesignTexts } from '../../../src/composables/designFields';
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
