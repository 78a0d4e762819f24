// Design rules against their published forms (CONTRACT section 2) and a fact of the trade.
import { describe, it, expect } from 'vitest';
import { expectClose } from '../helpers/expectClose';
import { defaultResonantGain, designGains, piForIntegratorPlant, pllPi, voltagePlantGain } from '../../shared/control/designRules';
import { sectionResponse, resonatorPrewarped } from '../../shared/control/blocks';
import type { DesignInput } from '../../shared/control/types';
import { readFileSync } from 'node:fs';

const demo = JSON.parse(readFileSync(new URL('../../examples/sc3-bench-l-120v.json', import.meta.url), 'utf8')) as DesignInput;

describe('design rules', () => {
  // 5 % drop rule (common practice, no source): w0 L I = 0.05 V → 3.3 kVA, 120 V, 60 Hz → about 0.58 mH.
  it('5 % inductor drop rule gives about 0.58 mH for 3.3 kVA at 120 V 60 Hz', () => {
    const current = 3300 / 120;
    const l = (0.05 * 120) / (2 * Math.PI * 60 * current);
    expectClose(l, 0.58e-3, { atol: 0.005e-3 }, 'L');
  });
  // PI on Kv/s: |L(j wc)| = 1 and phase -180 + pm (Buso & Mattavelli, Digital Control in Power Electronics, 2006).
  it.each([[12, 60, 192.8], [5, 45, 80], [20, 70, 400]])('voltage PI at %d Hz, %d deg on Kv=%d gives the targets', (fc, pmDeg, kv) => {
    const wc = 2 * Math.PI * fc;
    const { kp, ki } = piForIntegratorPlant(wc, (pmDeg * Math.PI) / 180, kv);
    // L(jw) = Kv (kp + ki/(jw)) / (jw)
    const re = (kv * -ki) / (wc * wc);
    const im = (kv * -kp) / wc;
    expectClose(Math.hypot(re, im), 1, { rtol: 1e-12 }, '|L|');
    expectClose(180 + (Math.atan2(im, re) * 180) / Math.PI, pmDeg, { atol: 1e-9 }, 'PM');
  });
  it('Kv from the averaged power balance', () => {
    expectClose(voltagePlantGain(120, 0.0022, 200), (Math.SQRT2 * 120) / (2 * 0.0022 * 200), { rtol: 1e-15 });
  });
  // wn = 4.6/(zeta ts), kp = 2 zeta wn, ki = wn^2 (CONTRACT section 2; Golestan et al., IEEE TPEL 2017).
  it('PLL PI', () => {
    const g = pllPi(0.06, 0.7071);
    const wn = 4.6 / (0.7071 * 0.06);
    expectClose([g.kp, g.ki], [2 * 0.7071 * wn, wn * wn], { rtol: 1e-15 });
  });
  it('default resonant gains spend the 10 % budget at crossover', () => {
    const kp = 3.77, wc = 2 * Math.PI * 1000, wb = Math.PI, ts = 5e-5;
    const total = [1, 3, 5, 7].reduce((sum, h) => {
      const kr = defaultResonantGain(kp, wc, h * 2 * Math.PI * 60, wb, 4);
      const r = sectionResponse(resonatorPrewarped(kr, h * 2 * Math.PI * 60, wb, ts), 1000, ts);
      return sum + Math.hypot(r.re, r.im);
    }, 0);
    expectClose(total, 0.1 * kp, { rtol: 0.03 }, 'sum of |R(j wc)|');
  });
  it('overrides win over rules and are reported', () => {
    const g = designGains({ ...demo, currentLoop: { ...demo.currentLoop, kp: 5 }, pll: { ...demo.pll, ki: 999 } });
    expectClose([g.currentKp, g.pllKi], [5, 999], { atol: 0 });
    expect(g.sources.currentKp).toBe('override');
    expect(g.sources.voltageKp).toBe('rule');
    // kp = 2 pi fc L when null (CONTRACT section 2)
    expectClose(designGains(demo).currentKp, 2 * Math.PI * 1000 * 0.0006, { rtol: 1e-15 });
  });
});
