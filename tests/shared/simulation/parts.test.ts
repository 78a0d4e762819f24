// The small parts: load sizing, sensing scale, harmonic tables, option validation and caps.
import { describe, expect, it } from 'vitest';
import { conversionConstants, perUnitBases } from '../../../shared/control';
import {
  adcCode, branchPower, compareHarmonics, defaultSimulationOptions, designSensing, frequencyStepTarget, gridInductanceForScr, iecClassALimitA,
  ieee519LimitPercent, IEEE_519_ROWS, legDuty, seriesLoadForPower, simulateScenario, SimulationError, unipolarCompares,
} from '../../../shared/simulation';
import { expectClose } from '../../helpers/expectClose';
import { analysisOf, demoDesign } from './helpers';

const sc3 = demoDesign('sc3-bench-l-120v.json');

describe('load sizing (phasor power S = V^2 / Z*)', () => {
  it.each([['lagging', 1], ['leading', -1]] as const)('%s: 3300 VA at pf 0.8 draws P = 2640 W and Q = %d x 1980 var at 120 V', (kind, sign) => {
    const p = branchPower(seriesLoadForPower(120, 60, 3300, 0.8, kind), 120, 60);
    expectClose(p.activePowerW, 2640, { rtol: 1e-12 }, 'P');
    expectClose(p.reactivePowerVar, sign * 1980, { rtol: 1e-12 }, 'Q');
  });
  it('grid inductance at SCR 10 for SC-3: 120^2 / (10 x 3300 x 2 pi 60) = 1.1575 mH; stiff grid 0', () => {
    expectClose(gridInductanceForScr(sc3, 10), 14400 / (10 * 3300 * 2 * Math.PI * 60), { rtol: 1e-15 }, 'Lg');
    expect(gridInductanceForScr(sc3, null)).toBe(0);
  });
});

describe('sensing and PWM agree with the set\'s conversion constants (CONTRACT section 7)', () => {
  it('one ADC code is the same quantity for plant and firmware', () => {
    const s = designSensing(sc3);
    const k = conversionConstants(sc3);
    const b = perUnitBases(sc3);
    expectClose(s.currentAPerCode, k.currentPerCode * b.currentBaseA, { rtol: 1e-14 }, 'current');
    expectClose(s.gridVoltageVPerCode, k.gridVoltagePerCode * b.voltageBaseV, { rtol: 1e-14 }, 'grid voltage');
    expectClose(s.dcVoltageVPerCode, k.dcVoltagePerCode * b.dcVoltageBaseV, { rtol: 1e-14 }, 'DC voltage');
    expectClose(unipolarCompares(1, s.carrierCounts, 'none').compareA - s.carrierCounts / 2, k.countsPerModulation, { rtol: 1e-15 }, 'counts per unit of m');
  });
  it('codes round half away from zero and saturate to the signed range; duty is compare / counts', () => {
    const s = designSensing(sc3);
    expect(adcCode(2.5 * s.currentAPerCode, s.currentAPerCode, s, 'firmware')).toBe(3);
    expect(adcCode(-2.5 * s.currentAPerCode, s.currentAPerCode, s, 'firmware')).toBe(-3);
    expect(adcCode(1e9, s.currentAPerCode, s, 'firmware')).toBe(2047);
    expect(adcCode(-1e9, s.currentAPerCode, s, 'firmware')).toBe(-2048);
    expectClose(adcCode(2.25 * s.currentAPerCode, s.currentAPerCode, s, 'none'), 2.25, { rtol: 1e-14 }, 'unrounded');
    expect(unipolarCompares(0.5, 2500, 'firmware')).toEqual({ compareA: 1875, compareB: 625 });
    expectClose(legDuty(1875, 2500) - legDuty(625, 2500), 0.5, { rtol: 0 }, 'm = dA - dB');
  });
});

describe('harmonic limit tables (values from memory, see harmonicLimits.ts)', () => {
  it('IEEE 519-2014 table 2: rows by Isc/IL, bands by order, even orders at 25 %', () => {
    const weak = IEEE_519_ROWS[0];
    expect([3, 5, 7, 9].map((h) => ieee519LimitPercent(h, weak))).toEqual([4, 4, 4, 4]);
    expect([11, 13, 17, 23, 35, 49].map((h) => ieee519LimitPercent(h, weak))).toEqual([2, 2, 1.5, 0.6, 0.3, 0.3]);
    expect(ieee519LimitPercent(2, weak)).toBe(1);
    expect(IEEE_519_ROWS.map((r) => r.tddPercent)).toEqual([5, 8, 12, 15, 20]);
  });
  it('IEC 61000-3-2 class A: listed orders, 0.15 x 15 / h (odd 15-39), 0.23 x 8 / h (even 8-40), none above 40', () => {
    expect(iecClassALimitA(3)).toBe(2.3);
    expect(iecClassALimitA(5)).toBe(1.14);
    expectClose(iecClassALimitA(21) ?? NaN, 0.15 * 15 / 21, { rtol: 1e-15 }, 'h21');
    expectClose(iecClassALimitA(10) ?? NaN, 0.23 * 8 / 10, { rtol: 1e-15 }, 'h10');
    expect(iecClassALimitA(41)).toBeNull();
    expect(iecClassALimitA(1)).toBeNull();
  });
  it('compares a current: the row follows Isc/IL, a stiff grid takes the last row', () => {
    const amplitudes = new Array<number>(51).fill(0);
    amplitudes[1] = 10 * Math.SQRT2;
    amplitudes[5] = 0.5 * Math.SQRT2; // 5 %
    const stiff = compareHarmonics('ieee-519', amplitudes, 5, null);
    expect(stiff.basis).toBe('Isc/IL >= 1000');
    expect(stiff.pass).toBe(true);
    const weak = compareHarmonics('ieee-519', amplitudes, 5, 150); // Isc/IL = 15
    expect(weak.basis).toBe('Isc/IL < 20');
    expect(weak.rows.find((r) => r.harmonic === 5)?.pass).toBe(false);
    expect(weak.pass).toBe(false);
    const iec = compareHarmonics('iec-61000-3-2-class-a', amplitudes, 5, null);
    expect(iec.rows.find((r) => r.harmonic === 5)?.limitRmsA).toBe(1.14);
    expect(iec.pass).toBe(true);
  });
});

describe('options: rules named by path, caps', () => {
  const analysis = analysisOf(sc3);
  const fail = (patch: object): SimulationError => {
    try {
      simulateScenario(sc3, analysis, { ...defaultSimulationOptions('steady'), ...patch });
    } catch (err) {
      if (err instanceof SimulationError) return err;
      throw err;
    }
    throw new Error('accepted');
  };
  it.each([
    [{ durationS: 0.01 }, 'durationS'],
    [{ durationS: 11 }, 'durationS'],
    [{ durationS: Number.NaN }, 'durationS'],
    [{ scenario: 'blackout' }, 'scenario'],
    [{ model: 'detailed' }, 'model'],
    [{ shortCircuitRatio: 0.5 }, 'shortCircuitRatio'],
    [{ harmonicTable: 'en-50160' }, 'harmonicTable'],
    [{ backgroundHarmonics: [{ harmonic: 1, fraction: 0.01, phaseDeg: 0 }] }, 'backgroundHarmonics.0.harmonic'],
    [{ backgroundHarmonics: [{ harmonic: 5, fraction: 0.5, phaseDeg: 0 }] }, 'backgroundHarmonics.0.fraction'],
    [{ rectifierPowerW: -1 }, 'rectifierPowerW'],
    [{ tracePoints: 1e9 }, 'tracePoints'],
  ])('%j is refused at %s', (patch, path) => {
    const err = fail(patch);
    expect(err.code).toBe('invalid-option');
    expect(err.path).toBe(path);
    expect(err.message.startsWith(path)).toBe(true);
  });
  it('a run beyond the sample cap is refused before it starts', () => {
    const fast = demoDesign('sc3-bench-l-120v.json');
    fast.sampling.switchingFrequencyHz = 500000;
    const err = (() => { try { simulateScenario(fast, analysisOf(fast), { ...defaultSimulationOptions('steady'), durationS: 10 }); } catch (e) { return e; } return null; })();
    expect(err).toBeInstanceOf(SimulationError);
    expect((err as SimulationError).code).toBe('too-long');
  });
  it('the frequency step goes to the band edge farther from nominal, or -1 % without a band', () => {
    expect(frequencyStepTarget(sc3)).toEqual({ frequencyHz: 59.4, source: 'default' });
    const banded = demoDesign('sc3-bench-l-120v.json');
    banded.envelope = { gridFrequencyHz: [59.3, 60.5] };
    expect(frequencyStepTarget(banded)).toEqual({ frequencyHz: 59.3, source: 'envelope' });
    banded.envelope = { gridFrequencyHz: [59.8, 60.5] };
    expect(frequencyStepTarget(banded).frequencyHz).toBe(60.5);
  });
  it('a progress callback that throws stops the run', () => {
    expect(() => simulateScenario(sc3, analysis, defaultSimulationOptions('steady'), { progress: (f) => { if (f > 0.3) throw new SimulationError('cancelled', 'stopped'); } }))
      .toThrow(/stopped/);
  });
});
