// Signals, per-unit bases and defaults (CONTRACT section 7), checked by hand on a design of our own:
// "T-1 test unit", 230 V 50 Hz, 4.6 kVA, DC link 380 V, 16 kHz carrier.
import { describe, expect, it } from 'vitest';
import { parseDesign, symbolPrefixProblem } from '../../shared/api/design';
import { contractExampleDesign } from '../../shared/api/designExample';
import {
  analyzeDesign, blockScaleFactor, blockSignals, conversionConstants, defaultCarrierCounts, perUnitBases, resolveSignals,
  type DesignInput,
} from '../../shared/control';
import { firmwareSet } from '../../shared/firmware';
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

describe('scaled sections of T-1 by hand (CONTRACT section 7: numerator times g, denominator unchanged)', () => {
  // Given gains, so every number below is arithmetic on the design: kp_pr = 7.6 V/A, DC-link PI
  // 0.5 A/V + 10 A/(V s), PLL PI 150 + 10000/s; Ts = 1/16000 s.
  function given(): DesignInput {
    const d = t1();
    d.currentLoop = { ...d.currentLoop, kp: 7.6 };
    d.voltageLoop = { ...d.voltageLoop, kp: 0.5, ki: 10 };
    d.pll = { ...d.pll, kp: 150, ki: 10000 };
    return d;
  }
  const blocksOf = (d: DesignInput) => analyzeDesign(d, { sweepPoints: 0, responseSamples: 0 }).blocks;

  it('current-pr kp: 7.6 x (20 sqrt(2) / 380) = 0.4 sqrt(2) = 0.565685 pu/pu, integer round(0.4 sqrt(2) 2^30) in Q2.30', () => {
    const kp = blocksOf(given()).find((b) => b.id === 'current-pr')!.sections[0];
    expectClose(kp.scaled!.b[0], 0.4 * Math.SQRT2, { rtol: 1e-15 }, 'g kp');
    expect(kp.scaled!.a).toEqual([1, 0, 0]);
    expect(kp.fixed.fracBits).toBe(30); // a[0] = 1 caps F at W - 2
    expect(kp.fixed.b[0]).toBe(Math.round(0.4 * Math.SQRT2 * 2 ** 30));
    expect(kp.fixed.a[0]).toBe(2 ** 30);
  });

  it('pll-pi: b0 = (150 + 10000 / 32000) / (100 pi) = 0.478459, b1 = (-150 + 10000 / 32000) / (100 pi); a = [1, -1, 0]', () => {
    const pll = blocksOf(given()).find((b) => b.id === 'pll-pi')!.sections[0];
    expectClose(pll.scaled!.b[0], 150.3125 / (100 * Math.PI), { rtol: 1e-14 }, 'b0');
    expectClose(pll.scaled!.b[1], -149.6875 / (100 * Math.PI), { rtol: 1e-14 }, 'b1');
    expect(pll.scaled!.a).toEqual([1, -1, 0]);
    expect(pll.scaled!.gain).toBe(blockScaleFactor(given(), 'pll-pi'));
  });

  it('voltage-pi: b0 = (0.5 + 10 / 32000) x 380 / (20 sqrt(2)) = 6.72172 (A/V becomes pu/pu)', () => {
    const pi = blocksOf(given()).find((b) => b.id === 'voltage-pi')!.sections[0];
    expectClose(pi.scaled!.b[0], (0.5003125 * 380) / (20 * Math.SQRT2), { rtol: 1e-14 }, 'b0');
    expectClose(pi.scaled!.b[1], (-0.4996875 * 380) / (20 * Math.SQRT2), { rtol: 1e-14 }, 'b1');
    // |b0| in [4, 8): F = W - 4 = 28 keeps round(b0 2^F) within 2^31 - 1
    expect(pi.fixed.fracBits).toBe(28);
  });

  it('SI signals keep the SI numerators (g = 1) and their integers', () => {
    const d = given();
    d.signals = { units: 'si' };
    for (const block of blocksOf(d)) {
      for (const s of block.sections) {
        expect(s.scaled!.gain, block.id).toBe(1);
        expect(s.scaled!.b).toEqual(s.b);
      }
    }
  });

  it('limits in the Q3.29 signal word: round(1.2 2^29), round(0.1 2^29), round(0.95 2^29)', () => {
    const d = given();
    const set = firmwareSet(d, analyzeDesign(d, { sweepPoints: 0, responseSamples: 0 }));
    expect(set.limits.currentReference.word).toBe(644245094);
    expect(set.limits.pllFrequency.word).toBe(53687091);
    expect(set.limits.modulation.word).toBe(510027366);
    expectClose(set.limits.pllFrequency.value, 0.1, { rtol: 1e-15 }, '5 Hz / 50 Hz');
  });
});

describe('limit and sensing findings in per-unit words', () => {
  const findings = (d: DesignInput) => analyzeDesign(d, { sweepPoints: 0, responseSamples: 0 }).checks;
  const find = (d: DesignInput, id: string) => findings(d).find((c) => c.id === id)!;

  it('defaults: 1.2 pu current clamp (0.2 pu headroom), the rated point needs m = sqrt(2)(230 + 314.16 x 0.0006 x 20)/380 = 0.8700', () => {
    const d = t1();
    expect(find(d, 'limits-current-reference')).toMatchObject({ severity: 'info', unit: 'pu' });
    expectClose(find(d, 'limits-current-reference').value ?? NaN, 1.2, { rtol: 1e-15 }, 'clamp in pu');
    expect(find(d, 'limits-current-reference').message).toMatch(/0\.2 pu of headroom/);
    const m = (Math.SQRT2 * (230 + 100 * Math.PI * 0.0006 * 20)) / 380;
    expectClose(find(d, 'limits-modulation-index').value ?? NaN, m, { rtol: 1e-12 }, 'rated modulation');
    expect(find(d, 'limits-modulation-index').severity).toBe('info');
    expect(find(d, 'signals-current-sense-range')).toMatchObject({ severity: 'info', value: 2 });
  });

  it.each([
    ['limits-current-reference', (d: DesignInput) => { d.limits = { currentReferencePeakA: 25 }; }, 25 / 28.284271247461902],
    ['limits-modulation-index', (d: DesignInput) => { d.limits = { modulationIndexMax: 0.85 }; }, null],
    ['signals-current-sense-range', (d: DesignInput) => { d.signals = { currentSenseFullScaleA: 25 }; }, 25 / 28.284271247461902],
    ['signals-grid-voltage-sense-range', (d: DesignInput) => { d.signals = { gridVoltageSenseFullScaleV: 300 }; }, 300 / 325.2691193458119],
    ['signals-dc-voltage-sense-range', (d: DesignInput) => { d.signals = { dcVoltageSenseFullScaleV: 350 }; }, 350 / 380],
    ['limits-pll-frequency', (d: DesignInput) => { d.limits = { pllFrequencyDeviationHz: 0.5 }; d.envelope = { gridFrequencyHz: [49, 51] }; }, 0.01],
    ['signals-word-range', (d: DesignInput) => { d.signals = { units: 'si', signalFracBits: 29 }; }, null],
  ] as const)('%s is an error when the rated operating point already exceeds it', (id, mutate, valuePu) => {
    const d = t1();
    mutate(d);
    const c = find(d, id);
    expect(c.severity, c.message).toBe('error');
    expect(c.remedy).toMatch(/\w{5,}/);
    if (valuePu !== null) expectClose(c.value ?? NaN, valuePu, { rtol: 1e-12 }, `${id} in pu`);
    expect(analyzeDesign(d, { sweepPoints: 0, responseSamples: 0 }).checks.some((x) => x.severity === 'error')).toBe(true);
  });

  it('a current sensor below the current clamp but above the rated peak is a warning', () => {
    const d = t1();
    d.signals = { currentSenseFullScaleA: 30 };
    expect(find(d, 'signals-current-sense-range').severity).toBe('warning');
  });
});
