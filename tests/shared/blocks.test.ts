// Controller sections against scipy.signal.bilinear (fixture: tests/fixtures/scipy/generate_blocks.py,
// scipy 1.17.1) and against published closed forms.
import { describe, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { expectClose } from '../helpers/expectClose';
import { forEachStepSample, lowPassPrewarped, piTustin, resonatorPrewarped, sectionResponse, sogiPrewarped } from '../../shared/control/blocks';
import { resonanceHzFromDenominator } from '../../shared/control/resonance';

interface Pair { b: number[]; a: number[] }
interface Fixture {
  resonators: (Pair & { gridHz: number; harmonic: number; sampleRateHz: number; gain: number; bandwidthHz: number })[];
  sogi: { gridHz: number; sampleRateHz: number; k: number; d: Pair; q: Pair }[];
  lowpass: (Pair & { order: 1 | 2; cutoffHz: number; sampleRateHz: number })[];
  pi: (Pair & { kp: number; ki: number; sampleRateHz: number })[];
}
const fixture = JSON.parse(readFileSync(new URL('../fixtures/scipy/blocks.json', import.meta.url), 'utf8')) as Fixture;
const REL = { rtol: 1e-9, atol: 1e-15 };

describe('sections match scipy.signal.bilinear at the prewarped rate (scipy 1.17.1)', () => {
  it.each(fixture.resonators)('resonator h$harmonic of $gridHz Hz at $sampleRateHz Hz, bandwidth $bandwidthHz Hz', (c) => {
    const s = resonatorPrewarped(c.gain, 2 * Math.PI * c.gridHz * c.harmonic, 2 * Math.PI * c.bandwidthHz, 1 / c.sampleRateHz);
    expectClose(s.b, c.b, REL, 'b');
    expectClose(s.a, c.a, REL, 'a');
  });
  it.each(fixture.sogi)('SOGI k=$k, $gridHz Hz at $sampleRateHz Hz', (c) => {
    const s = sogiPrewarped(c.k, 2 * Math.PI * c.gridHz, 1 / c.sampleRateHz);
    expectClose(s.d.b, c.d.b, REL, 'D b');
    expectClose(s.d.a, c.d.a, REL, 'D a');
    expectClose(s.q.b, c.q.b, REL, 'Q b');
    expectClose(s.q.a, c.q.a, REL, 'Q a');
  });
  it.each(fixture.lowpass)('low-pass order $order, $cutoffHz Hz at $sampleRateHz Hz', (c) => {
    const s = lowPassPrewarped(c.order, 2 * Math.PI * c.cutoffHz, 1 / c.sampleRateHz);
    expectClose(s.b, c.b, REL, 'b');
    expectClose(s.a, c.a, REL, 'a');
  });
  it.each(fixture.pi)('PI kp=$kp ki=$ki at $sampleRateHz Hz (plain Tustin)', (c) => {
    const s = piTustin(c.kp, c.ki, 1 / c.sampleRateHz);
    expectClose(s.b, c.b, REL, 'b');
    expectClose(s.a, c.a, REL, 'a');
  });
});

describe('closed forms', () => {
  // Ideal resonator prewarped at h*w0: a1 = -2cos(h w0 Ts), a2 = 1 (Yepes et al., IEEE TPEL 25(7), 2010).
  it.each([[50, 1, 20000], [60, 7, 20000], [50, 13, 10000], [60, 3, 32000]])('ideal resonator %d Hz h%d at %d Hz', (f0, h, fs) => {
    const ts = 1 / fs;
    const s = resonatorPrewarped(10, 2 * Math.PI * f0 * h, 0, ts);
    expectClose(s.a[1], -2 * Math.cos(2 * Math.PI * f0 * h * ts), { rtol: 1e-12 }, 'a1');
    expectClose(s.a[2], 1, { atol: 0 }, 'a2');
    expectClose(resonanceHzFromDenominator(s.a, ts) ?? NaN, f0 * h, { rtol: 1e-9 }, 'resonance');
  });
  // SOGI with k = sqrt(2): D = 1∠0 and Q = 1∠-90° at w0 (Ciobotaru, Teodorescu & Blaabjerg, PESC 2006).
  it.each([[50, 10000], [60, 20000], [50, 32000]])('SOGI at %d Hz sampled at %d Hz is exact at w0', (f0, fs) => {
    const s = sogiPrewarped(Math.SQRT2, 2 * Math.PI * f0, 1 / fs);
    const d = sectionResponse(s.d, f0, 1 / fs);
    const q = sectionResponse(s.q, f0, 1 / fs);
    expectClose([d.re, d.im], [1, 0], { atol: 1e-9 }, 'D');
    expectClose([q.re, q.im], [0, -1], { atol: 1e-9 }, 'Q');
  });
  // Low-pass: unity DC gain and -3 dB at the (prewarped) cutoff (Oppenheim & Schafer, bilinear transformation).
  it.each([[1, 10, 20000], [2, 10, 20000], [2, 40, 16000]] as const)('low-pass order %d at %d Hz, fs %d Hz', (order, fc, fs) => {
    const s = lowPassPrewarped(order, 2 * Math.PI * fc, 1 / fs);
    const dc = sectionResponse(s, 0, 1 / fs);
    const atCutoff = sectionResponse(s, fc, 1 / fs);
    expectClose(dc.re, 1, { rtol: 1e-9 }, 'DC gain');
    expectClose(20 * Math.log10(Math.hypot(atCutoff.re, atCutoff.im)), -10 * Math.log10(2), { atol: 1e-9 }, 'gain at cutoff (dB)');
  });
  // PI by Tustin: b0 = kp + ki Ts/2, b1 = -kp + ki Ts/2 (Franklin, Powell & Workman, Digital Control of Dynamic Systems, 1998).
  it('PI Tustin', () => {
    const s = piTustin(0.4, 20, 5e-5);
    expectClose(s.b, [0.4 + 20 * 2.5e-5, -0.4 + 20 * 2.5e-5, 0], { rtol: 1e-15 }, 'b');
    expectClose(s.a, [1, -1, 0], { atol: 0 }, 'a');
  });
  // Damped resonator has gain kr and zero phase at wh (CONTRACT section 2 form).
  it('damped resonator gain at its resonance', () => {
    const s = resonatorPrewarped(250, 2 * Math.PI * 300, 2 * Math.PI * 0.5, 1 / 20000);
    const r = sectionResponse(s, 300, 1 / 20000);
    expectClose([r.re, r.im], [250, 0], { rtol: 1e-9, atol: 1e-6 }, 'R(j wh)');
  });
});

describe('cross-check values of REFERENCES (computed there with scipy 1.17)', () => {
  it('ideal resonator 50 Hz at 20 kHz', () => {
    const s = resonatorPrewarped(1, 2 * Math.PI * 50, 0, 5e-5);
    expectClose([s.b[0], -s.b[2], s.a[1], s.a[2]], [2.499897192889162e-5, 2.499897192889162e-5, -1.999753264963321, 1], { rtol: 1e-12 });
  });
  it('damped resonator wb = 5 rad/s, 50 Hz at 20 kHz', () => {
    const s = resonatorPrewarped(1, 2 * Math.PI * 50, 5, 5e-5);
    expectClose([s.b[0], s.a[1], s.a[2]], [2.499272400483339e-4, -1.999253472149031, 0.999500145519904], { rtol: 1e-12 });
  });
  it('SOGI k = sqrt 2, 50 Hz at 10 kHz', () => {
    const s = sogiPrewarped(Math.SQRT2, 2 * Math.PI * 50, 1e-4);
    expectClose([s.d.b[0], s.q.b[0], s.d.a[1], s.d.a[2]], [0.021728161744398, 3.41333240557e-4, -1.955578240315035, 0.956543676511203], { rtol: 1e-11 });
  });
  it('low-pass 10 Hz at 20 kHz, first order and Butterworth; |H(100 Hz)| = 0.0995', () => {
    const l1 = lowPassPrewarped(1, 2 * Math.PI * 10, 5e-5);
    const l2 = lowPassPrewarped(2, 2 * Math.PI * 10, 5e-5);
    expectClose([l1.b[0], l1.b[1], l1.a[1]], [1.568334083280985e-3, 1.568334083280985e-3, -0.996863331833438], { rtol: 1e-12 });
    expectClose([l2.b[0], l2.a[1], l2.a[2]], [2.461930046414063e-6, -1.995557124345789, 0.995566972065975], { rtol: 1e-11 });
    const h = sectionResponse(l1, 100, 5e-5);
    expectClose(Math.hypot(h.re, h.im), 0.0995, { atol: 5e-5 });
  });
});

describe('forEachStepSample', () => {
  // Hand-derived: H(z) = 0.5 / (1 - 0.5 z^-1) under a unit step gives y[n] = 1 - 0.5^(n+1).
  it('follows the closed form of a first-order section and stops when told', () => {
    const ys: number[] = [];
    const visited = forEachStepSample({ b: [0.5, 0, 0], a: [1, -0.5, 0] }, 40, (n, y) => { ys.push(y); return n < 29; });
    expectClose(visited, 30, { rtol: 0 });
    expectClose(ys, ys.map((_, n) => 1 - 0.5 ** (n + 1)), { rtol: 1e-15 });
  });

  // Hand-derived: the PI y[n] = y[n-1] + kp (u[n] - u[n-1]) + ki Ts u[n] ramps as kp + ki Ts (n + 1).
  it('ramps for an integrator with the backward-difference PI', () => {
    const kp = 2, kiTs = 0.01;
    const ys: number[] = [];
    forEachStepSample({ b: [kp + kiTs, -kp, 0], a: [1, -1, 0] }, 5, (_, y) => { ys.push(y); });
    expectClose(ys, [0, 1, 2, 3, 4].map((n) => kp + kiTs * (n + 1)), { rtol: 1e-14 });
  });
});
