// Signals, per-unit bases and defaults (CONTRACT section 7), checked by hand on a design of our own:
// "T-1 test unit", 230 V 50 Hz, 4.6 kVA, DC link 380 V, 16 kHz carrier.
import { describe, expect, it } from 'vitest';
import { parseDesign, symbolPrefixProblem } from '../../shared/api/design';
import { contractExampleDesign } from '../../shared/api/designExample';
import {
  blockScaleFactor, blockSignals, conversionConstants, defaultCarrierCounts, perUnitBases, resolveSignals,
  type DesignInput,
} from '../../shared/control';
import { expectClose } from '../helpers/expectClose';

function t1(): DesignInput {
  const d = contractExampleDesign('T-1 test unit');
  d.grid = { voltageRmsV: 230, frequencyHz: 50 };
  d.rating = { apparentPowerVA: 4600 };
  d.dcLink = { capacitanceF: 0.0015, voltageRefV: 380 };
  d.sampling = { switchingFrequencyHz: 16000, updatesPerCarrier: 1, computationDelaySamples: 1 };
  return d;
}

describe('per-unit bases by hand (T-1: 230 V, 50 Hz, 4.6 kVA, 380 V)', () => {
  it('Vbase = sqrt(2) 230 = 325.269 V, Ibase = sqrt(2) 4600/230 = sqrt(2) 20 = 28.2843 A, Zbase = 230^2/4600 = 11.5 ohm', () => {
    const b = perUnitBases(t1());
    expectClose(b.voltageBaseV, 325.2691193458119, { rtol: 1e-15 }, 'Vbase');
    expectClose(b.currentBaseA, 28.284271247461902, { rtol: 1e-15 }, 'Ibase');
    expectClose(b.impedanceBaseOhm, 11.5, { rtol: 1e-14 }, 'Zbase = Vrms^2 / S');
    expectClose(b.dcVoltageBaseV, 380, { rtol: 0 }, 'VdcBase');
    expectClose(b.angularFrequencyBaseRadPerS, 100 * Math.PI, { rtol: 1e-15 }, 'wBase');
  });

  it('g of every block: current-pr 28.2843/380 = 0.074432, voltage-pi 380/28.2843 = 13.4350, pll-pi 1/(100 pi), others 1', () => {
    const d = t1();
    expectClose(blockScaleFactor(d, 'current-pr'), 0.07443229275647869, { rtol: 1e-14 }, 'current-pr');
    expectClose(blockScaleFactor(d, 'voltage-pi'), 13.435028842544403, { rtol: 1e-14 }, 'voltage-pi');
    expectClose(blockScaleFactor(d, 'pll-pi'), 0.003183098861837907, { rtol: 1e-14 }, 'pll-pi');
    for (const id of ['sogi-d', 'sogi-q', 'reactive-lpf'] as const) expectClose(blockScaleFactor(d, id), 1, { rtol: 0 }, id);
  });

  it('SI units keep g = 1 everywhere and label the signals in A, V and rad/s', () => {
    const d = t1();
    d.signals = { units: 'si' };
    for (const s of blockSignals(d)) {
      expect(s.gain, s.blockId).toBe(1);
      expect(s.input.unit).not.toBe('pu');
    }
    expect(blockSignals(d).find((s) => s.blockId === 'pll-pi')?.output.unit).toBe('rad/s');
  });
});

describe('documented defaults', () => {
  it('fill every absent key and say so; a design file without the new sections still parses', () => {
    const parsed = parseDesign(JSON.parse(JSON.stringify(t1())));
    expect(parsed.ok).toBe(true);
    const r = resolveSignals(t1());
    expect(r.units).toBe('per-unit');
    expect(r.arithmetic).toBe('fixed');
    expect(r.structure).toBe('direct-form-1');
    expect(r.signalFracBits).toBe(29); // W - 3 for W = 32 (CONTRACT section 7)
    expect(r.signalFormat).toBe('Q3.29');
    expect(r.adcBits).toBe(12);
    expectClose(r.currentSenseFullScaleA, 2 * 28.284271247461902, { rtol: 1e-15 }, '2 x rated peak');
    expectClose(r.gridVoltageSenseFullScaleV, 1.5 * 325.2691193458119, { rtol: 1e-15 }, '1.5 x Vbase');
    expectClose(r.dcVoltageSenseFullScaleV, 570, { rtol: 1e-15 }, '1.5 x 380 V');
    expect(r.pwmCarrierCounts).toBe(3125); // 100 MHz / (2 x 16 kHz)
    expectClose(r.currentReferencePeakA, 1.2 * 28.284271247461902, { rtol: 1e-15 }, '1.2 x rated peak');
    expectClose(r.modulationIndexMax, 0.95, { rtol: 0 }, 'm max');
    expectClose(r.pllFrequencyDeviationHz, 5, { rtol: 1e-15 }, '10 % of 50 Hz');
    expect(r.symbolPrefix).toBeNull();
    expect(Object.values(r.sources).every((s) => s === 'default')).toBe(true);
  });

  it('takes the design values when given, and the SI default word keeps one bit over the largest full scale', () => {
    const d = t1();
    d.signals = { units: 'si', dcVoltageSenseFullScaleV: 600, currentSenseFullScaleA: 50, gridVoltageSenseFullScaleV: 400 };
    const r = resolveSignals(d);
    expect(r.sources['signals.dcVoltageSenseFullScaleV']).toBe('design');
    // 600 V needs 10 integer bits (2^10 = 1024 > 600); one more for headroom and the sign: F = 32 - 2 - 10 = 20.
    expect(r.signalFracBits).toBe(20);
  });

  it('carrier counts: 100 MHz / (2 fsw), kept within a 16-bit period register', () => {
    expect(defaultCarrierCounts(20000)).toBe(2500);
    expect(defaultCarrierCounts(500)).toBe(65535);
    expect(defaultCarrierCounts(1e6)).toBe(50);
  });

  it('conversion constants: one current code is FS / 2^(N-1) / Ibase = 2/2048 pu with the defaults', () => {
    const c = conversionConstants(t1());
    expectClose(c.currentPerCode, 2 / 2048, { rtol: 1e-15 }, 'current');
    expectClose(c.gridVoltagePerCode, 1.5 / 2048, { rtol: 1e-15 }, 'grid voltage');
    expectClose(c.dcVoltagePerCode, 1.5 / 2048, { rtol: 1e-15 }, 'DC link');
    expectClose(c.countsPerModulation, 1562.5, { rtol: 0 }, 'carrier / 2');
    expectClose(c.feedForwardFactor, 325.2691193458119 / 380, { rtol: 1e-15 }, 'Vbase / VdcBase');
    expect(c.reactiveFactor).toBe(2);
  });
});

describe('schema of the new sections', () => {
  const base = () => JSON.parse(JSON.stringify(t1()));
  it.each([
    ['signals.signalFracBits', (d: DesignInput) => { d.signals = { signalFracBits: 32 }; }, /at most|lie in/],
    ['signals.signalFracBits', (d: DesignInput) => { d.fixedPoint.wordBits = 16; d.signals = { signalFracBits: 16 }; }, /at most 15/],
    ['signals.adcBits', (d: DesignInput) => { d.signals = { adcBits: 40 }; }, /lie in/],
    ['signals.units', (d: DesignInput) => { (d as unknown as { signals: { units: string } }).signals = { units: 'volts' }; }, /per-unit/],
    ['limits.modulationIndexMax', (d: DesignInput) => { d.limits = { modulationIndexMax: 1.2 }; }, /lie in/],
    ['limits.pllFrequencyDeviationHz', (d: DesignInput) => { d.limits = { pllFrequencyDeviationHz: 30 }; }, /half the grid frequency/],
    ['firmware.symbolPrefix', (d: DesignInput) => { d.firmware = { symbolPrefix: '3phase' }; }, /C identifier/],
    ['fixedPoint.arithmetic', (d: DesignInput) => { (d.fixedPoint as unknown as { arithmetic: string }).arithmetic = 'double'; }, /float32/],
    ['envelope.gridFrequencyHz', (d: DesignInput) => { d.envelope = { gridFrequencyHz: [51, 52] }; }, /contain the nominal/],
    ['envelope.gridFrequencyHz', (d: DesignInput) => { d.envelope = { gridFrequencyHz: [30, 52] }; }, /20 %/],
    ['envelope.shortCircuitRatioMin', (d: DesignInput) => { d.envelope = { shortCircuitRatioMin: 0.5 }; }, /null|lie in/],
    ['signals', (d: DesignInput) => { (d as unknown as { signals: object }).signals = { adcbits: 12 }; }, /unknown key/],
  ])('rejects %s', (path, mutate, rule) => {
    const d = base();
    mutate(d);
    const r = parseDesign(d);
    expect(r.ok).toBe(false);
    if (!r.ok) {
      const issue = r.issues.find((i) => i.path === path);
      expect(issue, JSON.stringify(r.issues)).toBeDefined();
      expect(issue?.message).toMatch(rule);
    }
  });

  it('accepts a complete section 7 example', () => {
    const d = base();
    d.signals = { units: 'per-unit', signalFracBits: 29, currentSenseFullScaleA: 40, gridVoltageSenseFullScaleV: 400, dcVoltageSenseFullScaleV: 500, adcBits: 12, pwmCarrierCounts: 2500 };
    d.limits = { currentReferencePeakA: 30, modulationIndexMax: 0.95, pllFrequencyDeviationHz: 5 };
    d.firmware = { symbolPrefix: 'SC3' };
    d.fixedPoint = { wordBits: 32, arithmetic: 'fixed', structure: 'quantization-robust' };
    d.envelope = { shortCircuitRatioMin: 5, filterTolerance: 0.1, gridFrequencyHz: [49.3, 50.5], gridVoltageTolerance: 0.1, dcLinkCapacitanceTolerance: 0.2 };
    const r = parseDesign(d);
    expect(r.ok, JSON.stringify(r)).toBe(true);
  });

  it.each([
    ['SC3', null], ['inv_a1', null], ['x', null], ['E', null],
    ['strobe', /reserves/], ['isr', /reserves/], ['Eco', /reserves/], ['SIG', /reserves/], ['LC', /reserves/],
    ['uint8', /reserves/], ['PRIX', /reserves/], ['_x', /C identifier/], ['a__b', /C identifier/], ['a_', /C identifier/],
    ['abcdefghijklm', /1 to 12/], ['', /1 to 12/],
  ] as const)('symbol prefix %s (C99 7.1.3 and 7.26 reserved names)', (prefix, problem) => {
    const got = symbolPrefixProblem(prefix);
    if (problem === null) expect(got).toBeNull();
    else expect(got).toMatch(problem);
  });
});
