import { describe, expect, it } from 'vitest';
import { ControlError, freqResponseS, freqResponseZ, logspace, transferFunction, tustinPrewarp, unwrapDeg } from '../../shared/control/index';
import { expectClose } from '../helpers/expectClose';

const continuous = { kind: 'continuous' } as const;

describe('continuous and discrete frequency responses, hand-derived closed forms', () => {
  it('first-order lag 1/(s + 1): |H(j1)| = 1/sqrt(2), arg = -45 deg', () => {
    const r = freqResponseS(transferFunction([1], [1, 1], continuous), [0, 1, 1e6]);
    expectClose(r.magnitude, [1, Math.SQRT1_2, 1e-6], { rtol: 1e-12 }, 'magnitude');
    expectClose(r.phaseRad, [0, -Math.PI / 4, -Math.PI / 2 + 1e-6], { atol: 1e-12 }, 'phase');
  });
  it('discrete integrator Ts/(z - 1): |H| = Ts/(2 sin(w Ts/2)), arg = -90 deg - w Ts/2', () => {
    const Ts = 1e-4;
    const w = [10, 1000, 20000];
    const r = freqResponseZ(transferFunction([Ts], [1, -1], { kind: 'discrete', samplePeriodS: Ts }), w);
    expectClose(r.magnitude, w.map((x) => Ts / (2 * Math.sin((x * Ts) / 2))), { rtol: 1e-12 }, 'magnitude');
    expectClose(r.phaseRad, w.map((x) => -Math.PI / 2 - (x * Ts) / 2), { atol: 1e-12 }, 'phase');
  });
  it('prewarped Butterworth low-pass: unity at DC, exactly -3.01 dB (1/sqrt 2) and -90 deg at the cutoff', () => {
    const wc = 2 * Math.PI * 10;
    const Ts = 5e-5;
    const d = tustinPrewarp(transferFunction([wc * wc], [1, Math.SQRT2 * wc, wc * wc], continuous), Ts, wc);
    const r = freqResponseZ(d, [0, wc]);
    expectClose(r.magnitude, [1, Math.SQRT1_2], { rtol: 1e-9 }, 'magnitude');
    expectClose(r.phaseRad[1], -Math.PI / 2, { atol: 1e-9 }, 'phase');
  });
  it('SOGI with k = sqrt 2 at 50 Hz, 10 kHz, prewarped: D = 1 at 0 deg, Q = 1 at -90 deg at w0 (Ciobotaru et al. 2006)', () => {
    const w0 = 2 * Math.PI * 50;
    const k = Math.SQRT2;
    const D = tustinPrewarp(transferFunction([k * w0, 0], [1, k * w0, w0 * w0], continuous), 1e-4, w0);
    const Q = tustinPrewarp(transferFunction([k * w0 * w0], [1, k * w0, w0 * w0], continuous), 1e-4, w0);
    const rd = freqResponseZ(D, [w0]);
    const rq = freqResponseZ(Q, [w0]);
    expectClose([rd.magnitude[0], rd.phaseRad[0]], [1, 0], { atol: 1e-12 }, 'D');
    expectClose([rq.magnitude[0], rq.phaseRad[0]], [1, -Math.PI / 2], { atol: 1e-12 }, 'Q');
    // scipy 1.17 cross-check of the same coefficients: D b0 = 0.021728161744398, a1 = -1.955578240315035
    expectClose([D.num[0], D.den[1], D.den[2], Q.num[0]], [0.021728161744398, -1.955578240315035, 0.956543676511203, 3.41333240557e-4], { rtol: 1e-11 }, 'coefficients');
  });
  it('timebase is checked', () => {
    expect(() => freqResponseZ(transferFunction([1], [1, 1], continuous), [1])).toThrow(ControlError);
    expect(() => freqResponseS(transferFunction([1], [1, 0.5], { kind: 'discrete', samplePeriodS: 1 }), [1])).toThrow(ControlError);
  });
});

describe('grids and unwrapping', () => {
  it('logspace: endpoints exact, constant ratio', () => {
    const g = logspace(1, 10000, 5);
    expectClose(g, [1, 10, 100, 1000, 10000], { rtol: 1e-14 }, 'grid');
    expect(logspace(1, 2, 0)).toEqual([]);
    expect(() => logspace(0, 1, 3)).toThrow(ControlError);
  });
  it('unwrapDeg removes 360 degree jumps and keeps genuine steps below 180', () => {
    expectClose(unwrapDeg([170, -170, -10, 100]), [170, 190, 350, 460], { atol: 1e-12 }, 'unwrap');
    expectClose(unwrapDeg([0, -100, -200 + 360]), [0, -100, -200], { atol: 1e-12 }, 'through -180');
  });
});
