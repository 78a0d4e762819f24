// Acceptance on every demo design (examples/): the steady scenario compensates the load's reactive
// power (grid power factor >= 0.98, the unit supplies the load's vars) and holds the DC link within
// 1 % of its reference; the event scenarios ride their event and end where the event puts them.
// Plus the seam the bit-exact control step plugs into.
import { describe, expect, it } from 'vitest';
import {
  createReferenceController, defaultSimulationOptions, frequencyStepTarget, simulateScenario, VOLTAGE_SAG_SCALE,
  type SampledController, type SimulationResult,
} from '../../../shared/simulation';
import { expectClose } from '../../helpers/expectClose';
import { analysisOf, DEMO_FILES, demoDesign } from './helpers';

describe.each(DEMO_FILES.map((f) => [f] as const))('%s', (file) => {
  const design = demoDesign(file);
  const analysis = analysisOf(design);
  const vRef = design.dcLink.voltageRefV;

  it('steady: grid power factor >= 0.98, the load\'s reactive power supplied by the unit, DC-link mean within 1 %', () => {
    const r = simulateScenario(design, analysis, defaultSimulationOptions('steady'));
    const m = r.metrics;
    expect(r.format).toBe('varsmith-simulation/1');
    expect(m.gridPowerFactor ?? 0).toBeGreaterThanOrEqual(0.98);
    // The load draws 0.6 S of inductive vars (power factor 0.8); the unit delivers them within 10 %
    // and the grid is left with less than 10 % of them.
    expectClose(m.loadReactivePowerVar, 0.6 * design.rating.apparentPowerVA, { rtol: 0.02 }, 'load vars');
    expectClose(m.unitReactivePowerVar, m.loadReactivePowerVar, { rtol: 0.1 }, 'unit vars');
    expect(Math.abs(m.gridReactivePowerVar)).toBeLessThan(0.1 * m.loadReactivePowerVar);
    expect(Math.abs(m.dcLinkMeanV - vRef)).toBeLessThanOrEqual(0.01 * vRef);
    expectClose(m.pllFrequencyHz ?? NaN, design.grid.frequencyHz, { atol: 0.01 }, 'PLL frequency');
    expect(m.settlingTimeS).not.toBeNull();
    expect(m.peakInverterCurrentRunA).toBeLessThan(m.currentLimitA);
    expect(r.harmonicLimits.table).toBe('ieee-519');
    expect(JSON.parse(JSON.stringify(r))).toEqual(r); // nothing NaN or infinite crosses JSON
  });

  it.each(['reactive-step', 'frequency-step', 'voltage-sag'] as const)('%s ends where its event puts it, DC link within 1 %', (scenario) => {
    const r: SimulationResult = simulateScenario(design, analysis, { ...defaultSimulationOptions(scenario), durationS: 0.36 });
    const m = r.metrics;
    expect(r.eventTimeS).not.toBeNull();
    expect(r.window.startS).toBeGreaterThan(r.eventTimeS ?? Infinity);
    expect(Math.abs(m.dcLinkMeanV - vRef)).toBeLessThanOrEqual(0.01 * vRef);
    expect(m.gridPowerFactor ?? 0).toBeGreaterThanOrEqual(0.98);
    if (scenario === 'reactive-step') {
      expect(m.loadReactivePowerVar).toBeLessThan(-0.55 * design.rating.apparentPowerVA); // capacitive now
      expectClose(m.unitReactivePowerVar, m.loadReactivePowerVar, { rtol: 0.1 }, 'unit absorbs the capacitive vars');
    }
    if (scenario === 'frequency-step') {
      expectClose(m.pllFrequencyHz ?? NaN, frequencyStepTarget(design).frequencyHz, { atol: 0.01 }, 'PLL follows the step');
    }
    if (scenario === 'voltage-sag') {
      expectClose(m.pccVoltageFundamentalRmsV, VOLTAGE_SAG_SCALE * design.grid.voltageRmsV, { rtol: 0.005 }, 'sagged PCC voltage');
    }
  });
});

// Fundamental tracking error (percent of rated peak) of SC-2's shipped coefficients in a word length and structure.
function shippedTracking(wordBits: 16 | 32, structure: 'direct-form-1' | 'quantization-robust'): number {
  const d = demoDesign('sc2-port-16bit-230v.json');
  d.fixedPoint = { ...d.fixedPoint, wordBits, structure };
  return simulateScenario(d, analysisOf(d), { ...defaultSimulationOptions('steady'), coefficients: 'quantized' }).metrics.fundamentalTrackingErrorPercent ?? NaN;
}

describe('the controller seam', () => {
  const design = demoDesign('sc3-bench-l-120v.json');
  const analysis = analysisOf(design);

  it('a controller plugged in through the hooks runs in the loop unchanged (same result as the built-in reference)', () => {
    const options = { ...defaultSimulationOptions('steady'), durationS: 10 / 60 };
    const builtIn = simulateScenario(design, analysis, options);
    const inner = createReferenceController(design, analysis, { coefficients: 'double', quantization: 'firmware' });
    let steps = 0;
    const wrapped: SampledController = { reset: () => inner.reset(), step: (codes) => { steps += 1; return inner.step(codes); } };
    const plugged = simulateScenario(design, analysis, options, { controller: { controller: wrapped, kind: 'wrapped-reference', coefficients: 'double' } });
    expect(steps).toBe(Math.round((builtIn.warmupS + builtIn.durationS) / builtIn.sampleTimeS));
    expect(plugged.controller.kind).toBe('wrapped-reference');
    expect(plugged.metrics).toEqual(builtIn.metrics);
  });

  it('a controller that logs nothing still runs: its traces and metrics are null, not NaN', () => {
    const inner = createReferenceController(design, analysis, { coefficients: 'double', quantization: 'firmware' });
    const silent: SampledController = { reset: () => inner.reset(), step: (codes) => ({ ...inner.step(codes), log: {} }) };
    const r = simulateScenario(design, analysis, { ...defaultSimulationOptions('steady'), durationS: 10 / 60 }, { controller: { controller: silent, kind: 'silent', coefficients: null } });
    expect(r.traces.pllFrequencyHz).toBeNull();
    expect(r.metrics.pllFrequencyHz).toBeNull();
    expect(r.metrics.fundamentalTrackingErrorPercent).toBeNull();
    expect(JSON.parse(JSON.stringify(r))).toEqual(r);
  });

  it('the 16-bit port tracks the fundamental worse than its 32-bit twin (its quantized coefficients, run in double)', () => {
    // The SC-2 demo's 16-bit h1 resonator lands at 49.74 Hz instead of 50 Hz (the analysis says
    // so): its gain at 50 Hz drops, and the fundamental of the tracking error grows. This compares
    // the coefficients the sets ship; the bit-exact arithmetic adds its own rounding on top.
    const port16 = shippedTracking(16, 'direct-form-1');
    const twin32 = shippedTracking(32, 'direct-form-1');
    expect(port16, `16-bit ${port16} % vs 32-bit ${twin32} %`).toBeGreaterThan(1.05 * twin32);
  });

  it('with the quantization-robust structure the same 16-bit port tracks like its 32-bit twin (within 2 %)', () => {
    // The delta-operator form keeps the resonance where it was designed in a 16-bit word.
    const robust16 = shippedTracking(16, 'quantization-robust');
    const twin32 = shippedTracking(32, 'direct-form-1');
    expectClose(robust16, twin32, { rtol: 0.02 }, 'fundamental tracking error, %');
  });
});
