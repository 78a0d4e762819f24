import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import {
  backwardEuler, ControlError, forwardEuler, freqResponseS, freqResponseZ, impulseInvariant, ImproperTransferFunctionError, parallel, resonanceByMethodHz,
  roots, series, TimebaseMismatchError, transferFunction, tustin, tustinPrewarp, zoh, type TransferFunction,
} from '../../shared/control/index';
import { expectClose } from '../helpers/expectClose';

interface Coefficients { num: number[]; den: number[] }
interface SystemCase {
  name: string; num: number[]; den: number[]; samplePeriodS: number; prewarpRadPerS: number;
  zoh: Coefficients; tustin: Coefficients; tustinPrewarp: Coefficients; forwardEuler: Coefficients; backwardEuler: Coefficients; impulseInvariant?: Coefficients;
}
interface ResonanceCase { resonanceRadPerS: number; bandwidthRadPerS: number; samplePeriodS: number; expectedHz: Record<string, number | null> }
const fixture = JSON.parse(readFileSync(new URL('../fixtures/scipy/discretize.json', import.meta.url), 'utf8')) as { generator: string; systems: SystemCase[]; resonanceByMethod: ResonanceCase[] };

const continuous = { kind: 'continuous' } as const;
const maxAbs = (v: readonly number[]): number => Math.max(...v.map(Math.abs));

function expectTf(actual: TransferFunction, expected: Coefficients, rtol: number, label: string): void {
  expect(actual.den.length, `${label} order`).toBe(expected.den.length);
  // coefficients relative to the largest one of each polynomial (1e-9 acceptance target)
  expectClose(actual.den, expected.den, { atol: rtol * maxAbs(expected.den) }, `${label} den`);
  expectClose(actual.num, expected.num, { atol: rtol * Math.max(maxAbs(expected.num), 1e-300) }, `${label} num`);
}

describe(`discretization vs ${fixture.generator}`, () => {
  it.each(fixture.systems)('$name', (c) => {
    const sys = transferFunction(c.num, c.den, continuous);
    // scipy.signal.cont2discrete method 'bilinear' / 'euler' / 'backward_diff' (scipy 1.17)
    expectTf(tustin(sys, c.samplePeriodS), c.tustin, 1e-10, 'tustin');
    expectTf(forwardEuler(sys, c.samplePeriodS), c.forwardEuler, 1e-10, 'forward Euler');
    expectTf(backwardEuler(sys, c.samplePeriodS), c.backwardEuler, 1e-10, 'backward Euler');
    // scipy.signal.bilinear at fs' = wp / (2 tan(wp Ts / 2)) (scipy 1.17)
    expectTf(tustinPrewarp(sys, c.samplePeriodS, c.prewarpRadPerS), c.tustinPrewarp, 1e-10, 'tustin prewarp');
    // scipy.signal.cont2discrete method 'zoh' (expm of the augmented matrix, scipy 1.17)
    expectTf(zoh(sys, c.samplePeriodS), c.zoh, 1e-9, 'zoh');
    // scipy.signal.cont2discrete method 'impulse' (strictly proper systems only, scipy 1.17)
    if (c.impulseInvariant) expectTf(impulseInvariant(sys, c.samplePeriodS), c.impulseInvariant, 1e-9, 'impulse invariant');
  });

  it.each(fixture.resonanceByMethod)('resonance by method, $resonanceRadPerS rad/s, wb $bandwidthRadPerS, Ts $samplePeriodS', (c) => {
    const got = resonanceByMethodHz(c.resonanceRadPerS, c.bandwidthRadPerS, c.samplePeriodS);
    expect(Object.keys(got)).toEqual(['tustin-prewarp', 'tustin', 'forward-euler', 'backward-euler', 'zoh', 'impulse-invariant']);
    for (const [key, want] of Object.entries(c.expectedHz)) {
      if (want === null) expect(got[key], key).toBeNull();
      else expectClose(got[key] as number, want, { atol: 1e-7 }, key);
    }
  });
});

describe('published cross-check values (scipy 1.17: signal.bilinear at the prewarped rate)', () => {
  const Ts = 5e-5;
  const w0 = 2 * Math.PI * 50;
  it('ideal resonator s/(s^2 + w0^2), 50 Hz at 20 kHz', () => {
    const d = tustinPrewarp(transferFunction([1, 0], [1, 0, w0 * w0], continuous), Ts, w0);
    expectClose(d.num, [2.499897192889162e-5, 0, -2.499897192889162e-5], { rtol: 1e-12, atol: 1e-20 }, 'b');
    expectClose(d.den, [1, -1.999753264963321, 1], { rtol: 1e-13 }, 'a');
  });
  it('damped resonator 2 wb s/(s^2 + 2 wb s + w0^2), wb = 5 rad/s', () => {
    const d = tustinPrewarp(transferFunction([10, 0], [1, 10, w0 * w0], continuous), Ts, w0);
    expectClose(d.num[0], 2.499272400483339e-4, { rtol: 1e-12 }, 'b0');
    expectClose(d.den, [1, -1.999253472149031, 0.999500145519904], { rtol: 1e-13 }, 'a');
  });
  it('Butterworth low-pass 10 Hz at 20 kHz', () => {
    const wc = 2 * Math.PI * 10;
    const d = tustinPrewarp(transferFunction([wc * wc], [1, Math.SQRT2 * wc, wc * wc], continuous), Ts, wc);
    expectClose(d.num[0], 2.461930046414063e-6, { rtol: 1e-11 }, 'b0');
    expectClose(d.den, [1, -1.995557124345789, 0.995566972065975], { rtol: 1e-13 }, 'a');
  });
  it('closed form: PI kp + ki/s under Tustin has b0 = kp + ki Ts/2, b1 = -kp + ki Ts/2, a = [1, -1] (Oppenheim & Schafer, bilinear transform)', () => {
    const kp = 0.37;
    const ki = 21.5;
    const d = tustin(transferFunction([kp, ki], [1, 0], continuous), 1e-4);
    expectClose(d.num, [kp + (ki * 1e-4) / 2, -kp + (ki * 1e-4) / 2], { rtol: 1e-14 }, 'b');
    expectClose(d.den, [1, -1], { atol: 1e-15 }, 'a');
  });
  it('closed form: prewarped ideal resonator has a1 = -2 cos(h w0 Ts), a2 = 1 (Teodorescu et al. 2006)', () => {
    for (const h of [1, 3, 7, 13]) {
      const w = h * 2 * Math.PI * 60;
      const d = tustinPrewarp(transferFunction([1, 0], [1, 0, w * w], continuous), 1 / 16000, w);
      expectClose(d.den, [1, -2 * Math.cos(w / 16000), 1], { atol: 1e-14 }, `h${h}`);
    }
  });
});

describe('invariants', () => {
  it.each([[50, 0, 5e-5], [50, 5, 1e-4], [60 * 13, Math.PI, 1e-4], [60 * 25, 2 * Math.PI, 1 / 16000], [1234.5, 40, 1 / 40000]])(
    'prewarped resonance lands exactly at the design frequency: %s Hz, wb %s, Ts %s', (fHz, wb, Ts) => {
      expectClose(resonanceByMethodHz(2 * Math.PI * fHz, wb, Ts)['tustin-prewarp'] as number, fHz, { rtol: 1e-10 }, 'prewarp');
    });

  it('plain Tustin moves the 13th of 60 Hz at 10 kHz by hertz, prewarped does not (Yepes et al. 2010)', () => {
    const r = resonanceByMethodHz(2 * Math.PI * 780, Math.PI, 1e-4);
    expect((r.tustin as number) - 780).toBeLessThan(-1);
    expectClose(r['tustin-prewarp'] as number, 780, { rtol: 1e-11 }, 'prewarp');
  });

  it('prewarped system equals the continuous one at the prewarp frequency', () => {
    const wp = 2 * Math.PI * 300;
    const sys = transferFunction([1, 2, 5e4], [1, 40, 3e6], continuous);
    const Ts = 1e-4;
    const s = freqResponseS(sys, [wp]);
    const z = freqResponseZ(tustinPrewarp(sys, Ts, wp), [wp]);
    expectClose(z.magnitude, s.magnitude, { rtol: 1e-11 }, 'magnitude');
    expectClose(z.phaseRad, s.phaseRad, { atol: 1e-11 }, 'phase');
  });

  it('Tustin and ZOH preserve the DC gain', () => {
    const sys = transferFunction([3, 7], [2, 5, 11], continuous);
    for (const d of [tustin(sys, 1e-3), zoh(sys, 1e-3), tustinPrewarp(sys, 1e-3, 100)]) {
      const dc = d.num.reduce((a, b) => a + b, 0) / d.den.reduce((a, b) => a + b, 0);
      expectClose(dc, 7 / 11, { rtol: 1e-10 }, 'dc');
    }
  });

  it('poles with Re(s) < 0 map inside the unit circle (Tustin, backward Euler, ZOH); ZOH poles are e^{p Ts}', () => {
    const den = [1, 30, 4e6]; // p = -15 +- j 1999.94
    const sys = transferFunction([1], den, continuous);
    const Ts = 1e-3;
    for (const d of [tustin(sys, Ts), backwardEuler(sys, Ts), zoh(sys, Ts)]) for (const [re, im] of roots(d.den)) expect(Math.hypot(re, im)).toBeLessThan(1);
    const [p] = roots(den).filter(([, im]) => im > 0);
    const zp = roots(zoh(sys, Ts).den).filter(([, im]) => im > 0)[0];
    const r = Math.exp(p[0] * Ts);
    expectClose(zp, [r * Math.cos(p[1] * Ts), r * Math.sin(p[1] * Ts)], { atol: 1e-12 }, 'e^{pTs}');
  });

  it('forward Euler maps a lightly damped resonance outside the unit circle (special case)', () => {
    const w = 2 * Math.PI * 500;
    const d = forwardEuler(transferFunction([1, 0], [1, 2, w * w], continuous), 1e-4);
    // radius^2 = a2 = 1 - 2 wb Ts + w^2 Ts^2 (hand-derived)
    expectClose(d.den[2], 1 - 2e-4 + w * w * 1e-8, { rtol: 1e-14 }, 'a2');
    expect(d.den[2]).toBeGreaterThan(1);
  });
});

describe('special cases and errors', () => {
  it('combining timebases throws TimebaseMismatchError', () => {
    const c = transferFunction([1], [1, 1], continuous);
    const d = transferFunction([1], [1, -0.5], { kind: 'discrete', samplePeriodS: 1e-4 });
    const d2 = transferFunction([1], [1, -0.5], { kind: 'discrete', samplePeriodS: 2e-4 });
    expect(() => series(c, d)).toThrow(TimebaseMismatchError);
    expect(() => parallel(d, d2)).toThrow(TimebaseMismatchError);
    try { series(d, d2); } catch (e) { expect((e as ControlError).code).toBe('timebase-mismatch'); }
  });
  it('an improper transfer function is refused', () => {
    expect(() => transferFunction([1, 0, 0], [1, 1], continuous)).toThrow(ImproperTransferFunctionError);
  });
  it('prewarping at or above Nyquist, non-positive periods and discrete inputs are refused', () => {
    const sys = transferFunction([1], [1, 1], continuous);
    expect(() => tustinPrewarp(sys, 1e-4, Math.PI / 1e-4)).toThrow(ControlError);
    expect(() => tustin(sys, 0)).toThrow(ControlError);
    expect(() => zoh(sys, Number.NaN)).toThrow(ControlError);
    expect(() => zoh(tustin(sys, 1e-3), 1e-3)).toThrow(ControlError);
    expect(() => resonanceByMethodHz(2 * Math.PI * 6000, 1, 1e-4)).toThrow(ControlError);
    expect(() => resonanceByMethodHz(100, -1, 1e-4)).toThrow(ControlError);
  });
  it('prewarp 0 is plain Tustin; the ideal resonator (wb = 0) keeps a2 = 1 under Tustin, 1 under backward Euler is < 1', () => {
    const w = 2 * Math.PI * 50;
    const sys = transferFunction([1, 0], [1, 0, w * w], continuous);
    expectClose(tustinPrewarp(sys, 1e-4, 0).den, tustin(sys, 1e-4).den, { atol: 0 }, 'same');
    expectClose(tustin(sys, 1e-4).den[2], 1, { atol: 1e-15 }, 'a2');
    expect(backwardEuler(sys, 1e-4).den[2]).toBeLessThan(1);
  });
  it('resonanceByMethodHz is JSON-safe (no NaN/Infinity)', () => {
    const r = resonanceByMethodHz(2 * Math.PI * 50, 0, 5e-5);
    expect(JSON.parse(JSON.stringify(r))).toEqual(r);
  });
});
