import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { readFileSync } from 'node:fs';
import {
  analyzeFixedSection, fixedPointChecks, impulseResponseL1Norm, impulseResponseL1NormDirect, maxPoleRadius, quantizedResonanceHz, resonatorHalfBandwidthHz,
} from '../../shared/control/fixedPoint';
import { quantizeSection } from '../../shared/control/quantize';
import { resonanceHzFromDenominator } from '../../shared/control/resonance';
import type { BlockId, BlockResult, SectionKind, SectionResult } from '../../shared/control/types';
import { expectClose } from '../helpers/expectClose';

interface SectionCase {
  name: string; kind: SectionKind; role: string; wordBits: number; samplePeriodS: number; designHz: number | null;
  b: number[]; a: number[]; dcGainDiscrete: number | null; dcGainFixed: number | null; maxPoleRadiusFixed: number;
  juryStable: boolean; outputL1Norm: number | null; errorL1Norm: number | null; fracBits: number; bInt: number[];
}
const cases = (JSON.parse(readFileSync(new URL('../fixtures/scipy/fixed_sections.json', import.meta.url), 'utf8')) as { cases: SectionCase[] }).cases;
const find = (prefix: string, wordBits: number): SectionCase => {
  const c = cases.find((k) => k.name.startsWith(prefix) && k.wordBits === wordBits);
  if (!c) throw new Error(`fixture case ${prefix} ${wordBits} missing`);
  return c;
};

function sectionOf(c: SectionCase, wordBits = c.wordBits): SectionResult {
  const fixed = quantizeSection(c.b, c.a, wordBits);
  const resonant = c.kind === 'resonator' || c.kind === 'sogi-band-pass' || c.kind === 'sogi-low-pass';
  return {
    role: c.role, kind: c.kind, prewarpHz: c.designHz, b: c.b, a: c.a, fixed,
    ...(resonant && c.designHz !== null ? { resonanceHz: { design: c.designHz, discrete: resonanceHzFromDenominator(c.a, c.samplePeriodS), fixed: quantizedResonanceHz(fixed, c.samplePeriodS) } } : {}),
  };
}
const blockOf = (id: BlockId, sections: SectionResult[]): BlockResult => ({ id, method: 'tustin-prewarp', gains: {}, sections });

describe('analyzeFixedSection against scipy 1.17 / numpy (generate_fixed.py)', () => {
  it.each(cases.map((c) => [`${c.name}, ${c.wordBits} bit`, c] as const))('%s', (_label, c) => {
    const section = sectionOf(c);
    const fa = analyzeFixedSection(section, section.fixed, c.samplePeriodS);
    // DC gain: exact rational in Python, so only the final division rounds
    for (const [got, want, label] of [[fa.dcGain.discrete, c.dcGainDiscrete, 'dc discrete'], [fa.dcGain.fixed, c.dcGainFixed, 'dc fixed']] as const) {
      if (want === null) expect(got, label).toBeNull();
      else expectClose(got ?? Number.NaN, want, { rtol: 1e-9, atol: 1e-15 }, label);
    }
    expectClose(fa.maxPoleRadiusFixed, c.maxPoleRadiusFixed, { rtol: 1e-9 }, 'max pole radius (numpy.roots)');
    expect(fa.maxPoleRadiusFixed < 1).toBe(c.juryStable || (c.bInt.length === 3 && section.fixed.a[1] === 0 && section.fixed.a[2] === 0));
    if (c.outputL1Norm === null) expect(fa.outputL1Norm).toBeNull();
    else expectClose(fa.outputL1Norm ?? Number.NaN, c.outputL1Norm, { rtol: 1e-7 }, 'l1 norm (scipy.signal.lfilter)');
    if (c.kind !== 'pi') {
      if (c.errorL1Norm === null) expect(fa.deadbandLsb).toBeNull();
      else expectClose(fa.deadbandLsb ?? Number.NaN, 0.5 * c.errorL1Norm, { rtol: 1e-7 }, 'dead band = 0.5 * l1(1/A)');
    }
    expect(JSON.parse(JSON.stringify(fa))).toEqual(fa);
  });

  it('first-order dead band equals 0.5 / (1 - p) LSB (Jackson 1970, rounding) and headroom follows the l1 norm', () => {
    const c = find('first-order low-pass', 16);
    const section = sectionOf(c);
    const fa = analyzeFixedSection(section, section.fixed, c.samplePeriodS);
    const p = -section.fixed.a[1] / 2 ** section.fixed.fracBits;
    expectClose(fa.deadbandLsb ?? Number.NaN, 0.5 / (1 - p), { rtol: 1e-9 }, 'dead band');
    expectClose(fa.deadbandLsb ?? Number.NaN, 160.6, { atol: 0.1 }, 'REFERENCES: about 159 LSB for 16 bit with rounding, 318 with truncation');
    expect(fa.headroomBits).toBe(1); // quantized DC gain 52/51 > 1
  });

  it('PI: unbounded output, integrator dead band 2^(F-1) / (bq0 + bq1) input LSB (closed form from the DF-I rounding)', () => {
    const c = find('PI kp = 0.8', 16);
    const section = sectionOf(c);
    const fa = analyzeFixedSection(section, section.fixed, c.samplePeriodS);
    expect(fa.outputL1Norm).toBeNull();
    expect(fa.headroomBits).toBeNull();
    expect(fa.dcGain.fixed).toBeNull();
    expect(section.fixed.b[0] + section.fixed.b[1]).toBe(33);
    expectClose(fa.deadbandLsb ?? Number.NaN, 8192 / 33, { rtol: 1e-12 }, 'integrator dead band');
    expect(fa.notes?.some((n) => n.includes('unbounded'))).toBe(true);
  });

  it('ideal resonator in 16 bits: b0 and b2 are lost, the state is unbounded', () => {
    const c = find('ideal resonator 50 Hz', 16);
    const section = sectionOf(c);
    const fa = analyzeFixedSection(section, section.fixed, c.samplePeriodS);
    expect(fa.lostCoefficients).toEqual(['b0', 'b2']);
    expect(fa.outputL1Norm).toBeNull();
    expect(fa.deadbandLsb).toBeNull();
    expectClose(fa.maxPoleRadiusFixed, 1, { atol: 0 }, 'a2 = 1 exactly');
  });

  it('the zero-crossing run sum of the l1 norm agrees with the sample-by-sample sum (fast-check)', () => {
    const pole = fc.record({
      radius: fc.double({ min: 0.05, max: 0.9995, noNaN: true }),
      thetaRad: fc.double({ min: 1e-3, max: 3.1, noNaN: true }),
      b: fc.array(fc.double({ min: -2, max: 2, noNaN: true }), { minLength: 3, maxLength: 3 }),
    });
    fc.assert(fc.property(pole, ({ radius, thetaRad, b }) => {
      const a = [1, -2 * radius * Math.cos(thetaRad), radius * radius];
      const fast = impulseResponseL1Norm(b, a);
      const direct = impulseResponseL1NormDirect(b, a);
      expect(fast === null).toBe(direct === null);
      if (fast !== null && direct !== null) expectClose(fast, direct, { rtol: 1e-8, atol: 1e-12 }, 'l1 norm');
    }), { numRuns: 200 });
    expectClose(impulseResponseL1NormDirect([1], [1, 0, -0.25]) ?? Number.NaN, 4 / 3, { rtol: 1e-12 }, 'even powers of 0.5');
  });

  it('closed forms of the helpers', () => {
    expectClose(impulseResponseL1Norm([0.5], [1, -0.5, 0]) ?? Number.NaN, 1, { rtol: 1e-12 }, 'geometric series');
    expect(impulseResponseL1Norm([1], [1, -2, 1])).toBeNull(); // double pole at z = 1
    expectClose(maxPoleRadius([1, -1.5, 0.5]), 1, { rtol: 1e-15 }, 'roots 1 and 0.5');
    expectClose(maxPoleRadius([1, 0, 0.25]), 0.5, { rtol: 1e-15 }, 'roots +-0.5j');
    // REFERENCES cross-check: damped resonator wb = 5 rad/s, 50 Hz at 20 kHz -> half-bandwidth 5 rad/s
    expectClose(resonatorHalfBandwidthHz([1, -1.999253472149031, 0.999500145519904], 5e-5), 5 / (2 * Math.PI), { rtol: 1e-4 }, 'half-bandwidth, prewarp scaling (w0 Ts)^2 / 12');
    // SOGI k = sqrt(2), 50 Hz: half-bandwidth k f0 / 2 (Ciobotaru et al. 2006: D(s) bandwidth k w0)
    expectClose(resonatorHalfBandwidthHz([1, -1.955578240315035, 0.956543676511203], 1e-4), Math.SQRT2 * 25, { rtol: 1e-3 }, 'SOGI half-bandwidth');
  });
});

describe('fixedPointChecks', () => {
  const ts20 = 5e-5;
  const resonatorCase = (bandwidthHz: number): SectionCase => {
    // damped resonator kr = 1 with wb = 2 pi bandwidthHz, 50 Hz at 20 kHz, prewarped Tustin (closed form of the bilinear map)
    const w0 = 2 * Math.PI * 50;
    const wb = 2 * Math.PI * bandwidthHz;
    const k = w0 / Math.tan((w0 * ts20) / 2);
    const d = k * k + 2 * wb * k + w0 * w0;
    const b0 = (2 * wb * k) / d;
    return { ...find('damped resonator wb = 5', 16), b: [b0, 0, -b0], a: [1, (2 * w0 * w0 - 2 * k * k) / d, (k * k - 2 * wb * k + w0 * w0) / d] };
  };

  it('16 bit: the 50 Hz resonator drifts by 0.26 Hz: error with a remedy; 32 bit: info within 0.2 mHz', () => {
    const c = resonatorCase(0.5);
    const check16 = fixedPointChecks([blockOf('current-pr', [sectionOf(c, 16)])], { samplePeriodS: ts20, wordBits: 16, gridFrequencyHz: 50 })
      .find((k) => k.id === 'pr-h1-quantization-drift');
    expect(check16).toMatchObject({ severity: 'error', unit: 'Hz', blockId: 'current-pr' });
    expectClose(check16!.value ?? Number.NaN, 50 - 49.742, { atol: 2e-3 }, 'drift');
    expectClose(check16!.limit ?? Number.NaN, 0.05, { rtol: 1e-3 }, '0.1 x 0.5 Hz half-bandwidth');
    expect(check16!.remedy).toMatch(/32-bit word/);
    expect(check16!.remedy).toMatch(/quantization-robust structure/);
    const checks32 = fixedPointChecks([blockOf('current-pr', [sectionOf(c, 32)])], { samplePeriodS: ts20, wordBits: 32, gridFrequencyHz: 50 });
    const drift32 = checks32.find((k) => k.id === 'pr-h1-quantization-drift');
    expect(drift32?.severity).toBe('info');
    expect(drift32!.value!).toBeLessThan(2e-4);
    expect(checks32.filter((k) => k.severity === 'error')).toEqual([]);
  });

  it('an ideal resonator uses the 0.01 Hz limit and reports the unbounded state', () => {
    const c = find('ideal resonator 50 Hz', 32);
    const checks = fixedPointChecks([blockOf('current-pr', [sectionOf(c)])], { samplePeriodS: ts20, wordBits: 32, gridFrequencyHz: 50 });
    expect(checks.find((k) => k.id === 'pr-h1-quantization-drift')).toMatchObject({ severity: 'info', limit: 0.01 });
    expect(checks.find((k) => k.id === 'current-pr-unbounded-state')).toMatchObject({ severity: 'info' });
    const checks16 = fixedPointChecks([blockOf('current-pr', [sectionOf(c, 16)])], { samplePeriodS: ts20, wordBits: 16, gridFrequencyHz: 50 });
    expect(checks16.find((k) => k.id === 'current-pr-lost-coefficient')).toMatchObject({ severity: 'error', value: 2 });
  });

  it('16-bit Butterworth 10 Hz at 20 kHz: the quantized pole reaches z = 1 (REFERENCES, scipy)', () => {
    const c = find('Butterworth', 16);
    const checks = fixedPointChecks([blockOf('reactive-lpf', [sectionOf(c)])], { samplePeriodS: ts20, wordBits: 16, gridFrequencyHz: 50 });
    expect(checks.find((k) => k.id === 'reactive-lpf-pole-at-one')).toMatchObject({ severity: 'error', value: 0, unit: 'LSB' });
    expect(checks.find((k) => k.id === 'reactive-lpf-lost-coefficient')).toMatchObject({ severity: 'error' });
    const checks32 = fixedPointChecks([blockOf('reactive-lpf', [sectionOf(c, 32)])], { samplePeriodS: ts20, wordBits: 32, gridFrequencyHz: 50 });
    expect(checks32.filter((k) => k.severity !== 'info')).toEqual([]);
  });

  it('16-bit first-order low-pass: DC gain 2 % off and a 160 LSB dead band are warnings', () => {
    const c = find('first-order low-pass', 16);
    const checks = fixedPointChecks([blockOf('reactive-lpf', [sectionOf(c)])], { samplePeriodS: ts20, wordBits: 16, gridFrequencyHz: 50 });
    const dc = checks.find((k) => k.id === 'reactive-lpf-dc-gain-error');
    expect(dc).toMatchObject({ severity: 'warning', unit: '%', limit: 1 });
    expectClose(dc!.value ?? Number.NaN, 100 / 51, { rtol: 1e-6 }, 'DC gain 52/51');
    const db = checks.find((k) => k.id === 'reactive-lpf-deadband');
    expect(db).toMatchObject({ severity: 'warning', unit: 'LSB' });
    expectClose(db!.limit ?? Number.NaN, 32.767, { rtol: 1e-9 }, '0.1 % of full scale');
  });

  it('PI: a tiny ki*Ts loses the integral action in 16 bits; a normal one is clean in 32 bits', () => {
    const tiny = find('PI kp = 0.05', 16);
    const checks = fixedPointChecks([blockOf('voltage-pi', [sectionOf(tiny)])], { samplePeriodS: ts20, wordBits: 16, gridFrequencyHz: 50 });
    expect(checks.find((k) => k.id === 'voltage-pi-integral-lost')).toMatchObject({ severity: 'error', value: 0 });
    const coarse = find('PI kp = 0.8', 16);
    const checksCoarse = fixedPointChecks([blockOf('pll-pi', [sectionOf(coarse)])], { samplePeriodS: ts20, wordBits: 16, gridFrequencyHz: 50 });
    // ki*Ts = 0.002: errors below 2^13 / 33 = 248 LSB (0.76 % of full scale) never move the integrator
    expect(checksCoarse.find((k) => k.id === 'pll-pi-integral-deadband')).toMatchObject({ severity: 'warning', unit: 'LSB' });
    expect(checksCoarse.find((k) => k.id === 'pll-pi-integral-gain-error')).toBeUndefined(); // 33 LSB for 32.77: 0.7 % < 1 %
    const coarse32 = fixedPointChecks([blockOf('pll-pi', [sectionOf(coarse, 32)])], { samplePeriodS: ts20, wordBits: 32, gridFrequencyHz: 50 });
    expect(coarse32.find((k) => k.id === 'pll-pi-integral-deadband')).toBeUndefined(); // 250 LSB of a 32-bit word is 1e-7 of full scale
    const tiny32 = fixedPointChecks([blockOf('voltage-pi', [sectionOf(tiny, 32)])], { samplePeriodS: ts20, wordBits: 32, gridFrequencyHz: 50 });
    expect(tiny32.find((k) => k.id === 'voltage-pi-integral-deadband')).toMatchObject({ severity: 'warning' }); // ki*Ts = 2e-7: 2.5e6 LSB
    expect(checksCoarse.find((k) => k.id === 'pll-pi-unbounded-state')).toMatchObject({ severity: 'info' });
    const clean = fixedPointChecks([blockOf('pll-pi', [sectionOf(find('PI kp = 153', 32))])], { samplePeriodS: ts20, wordBits: 32, gridFrequencyHz: 50 });
    expect(clean.filter((k) => k.severity !== 'info')).toEqual([]);
  });

  it('SOGI: one sogi-quantization-drift check (worst of D and Q), within tan(1 deg) x half-bandwidth', () => {
    const d = sectionOf(find('SOGI D', 16));
    const q = sectionOf(find('SOGI Q', 16));
    const checks = fixedPointChecks([blockOf('sogi-d', [d]), blockOf('sogi-q', [q])], { samplePeriodS: 1e-4, wordBits: 16, gridFrequencyHz: 50 });
    const drift = checks.filter((k) => k.id === 'sogi-quantization-drift');
    expect(drift).toHaveLength(1);
    expectClose(drift[0].value ?? Number.NaN, 0.2873, { atol: 1e-3 }, 'SOGI drift 16 bit');
    expectClose(drift[0].limit ?? Number.NaN, Math.tan(Math.PI / 180) * Math.SQRT2 * 25, { rtol: 2e-3 }, 'limit');
    expect(drift[0].severity).toBe('info');
  });

  it('special cases: a gain beyond the word (F < 0) is a coefficient-range error; a gain above 1 reports headroom; bad Ts throws', () => {
    const huge = quantizeSection([40000, 0, 0], [1, 0, 0], 16);
    expect(huge.fracBits).toBe(-1);
    const checks = fixedPointChecks([blockOf('current-pr', [{ role: 'proportional', kind: 'gain', prewarpHz: null, b: [40000, 0, 0], a: [1, 0, 0], fixed: huge }])], { samplePeriodS: ts20, wordBits: 16, gridFrequencyHz: 50 });
    expect(checks).toHaveLength(1);
    expect(checks[0]).toMatchObject({ id: 'current-pr-coefficient-range', severity: 'error', value: -1 });
    const kp = sectionOf(find('proportional kp = 3.77', 16));
    const fa = analyzeFixedSection(kp, kp.fixed, ts20);
    expect(fa.deadbandLsb).toBeNull();
    expect(fa.headroomBits).toBe(2); // l1 = 3.770 -> 2 bits
    expect(fixedPointChecks([blockOf('current-pr', [kp])], { samplePeriodS: ts20, wordBits: 16, gridFrequencyHz: 50 })).toEqual([
      expect.objectContaining({ id: 'current-pr-headroom', severity: 'info', value: 2, unit: 'bit' }),
    ]);
    expect(() => analyzeFixedSection(kp, kp.fixed, 0)).toThrow(/samplePeriodS/);
    expect(() => analyzeFixedSection(kp, kp.fixed, Number.NaN)).toThrow(/samplePeriodS/);
  });

  it('every error and warning names a remedy; every check survives JSON and has a block id', () => {
    const all = cases.map((c) => blockOf(c.kind === 'pi' ? 'voltage-pi' : c.kind === 'low-pass' ? 'reactive-lpf' : c.kind === 'gain' ? 'current-pr' : c.kind === 'resonator' ? 'current-pr' : 'sogi-d', [sectionOf(c)]));
    const checks = fixedPointChecks(all, { samplePeriodS: ts20, wordBits: 16, gridFrequencyHz: 50 });
    expect(checks.length).toBeGreaterThan(10);
    for (const check of checks) {
      if (check.severity !== 'info') expect(check.remedy, check.id).toMatch(/\w{5,}/);
      expect(check.id).toMatch(/^[a-z0-9]+(-[a-z0-9]+)*$/);
      expect(check.blockId).toBeTruthy();
      expect(check.message.length).toBeGreaterThan(20);
    }
    expect(JSON.parse(JSON.stringify(checks))).toEqual(checks);
  });
});
