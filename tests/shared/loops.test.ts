import { describe, expect, it } from 'vitest';
import { readFileSync } from 'node:fs';
import { analyzeLoops, ControlError, filterAdmittanceStateSpace, ssToTf, zohStateSpace, type LoopInputs } from '../../shared/control/index';
import { atReferenceSamples, expectClose } from '../helpers/expectClose';

type StepId = 'current-step' | 'pll-phase-step' | 'dc-link-load-step';
interface FixtureCase { name: string; inputs: LoopInputs; plantZoh: { num: number[]; den: number[] }; steps?: Record<StepId, number[]> }
const fixture = JSON.parse(readFileSync(new URL('../fixtures/scipy/loops.json', import.meta.url), 'utf8')) as { generator: string; cases: FixtureCase[] };
const maxAbs = (v: readonly number[]): number => Math.max(...v.map(Math.abs));

describe(`plant: ZOH of the filter admittance vs scipy.signal.cont2discrete of the CONTRACT transfer function (${fixture.generator})`, () => {
  it.each(fixture.cases.map((c) => [c.name, c] as const))('%s', (_name, c) => {
    // the physical state-space model (i1, i2, vc) must equal 1/(R + L1 s + Z2 Zc/(Z2 + Zc)) after ZOH
    const g = ssToTf(zohStateSpace(filterAdmittanceStateSpace(c.inputs.filter), c.inputs.samplePeriodS));
    expectClose(g.den, c.plantZoh.den, { atol: 1e-9 * maxAbs(c.plantZoh.den) }, 'den');
    expectClose(g.num, c.plantZoh.num, { atol: 1e-9 * maxAbs(c.plantZoh.num) }, 'num');
  });
});

describe('step responses vs a per-sample simulation of scipy.signal.tf2ss blocks (scipy 1.17)', () => {
  const withSteps = fixture.cases.filter((c) => c.steps);
  it.each(withSteps.map((c) => [c.name, c] as const))('%s', (_name, c) => {
    const steps = c.steps as Record<StepId, number[]>;
    const n = steps['current-step'].length;
    const time = analyzeLoops(c.inputs, { sweepPoints: 0, responseSamples: n }).time;
    expect(time).not.toBeNull();
    for (const id of ['current-step', 'pll-phase-step', 'dc-link-load-step'] as const) {
      const got = time![id];
      expect(got.value).toHaveLength(n);
      // Slow loops are recorded over a longer horizon (every stride-th sample): compare where both exist.
      const paired = atReferenceSamples(got, steps[id], c.inputs.samplePeriodS);
      expectClose(paired.got, paired.want, { atol: 1e-10 * maxAbs(steps[id]) }, id);
      if (id === 'current-step') expectClose(got.timeS[n - 1], (n - 1) * c.inputs.samplePeriodS, { rtol: 1e-12 }, `${id} time`);
      expect(got.label.length).toBeGreaterThan(10);
    }
  });
  it('PLL: the phase error starts at the 1 rad step and decays to 0 (type-2 loop, common practice, no source)', () => {
    const c = withSteps[0];
    const e = analyzeLoops(c.inputs, { sweepPoints: 0, responseSamples: 8000 }).time!['pll-phase-step'].value;
    expectClose(e[0], 1, { atol: 1e-15 }, 'first');
    expect(Math.abs(e[e.length - 1])).toBeLessThan(1e-3);
  });
});

describe('result shape', () => {
  const c = fixture.cases[1];
  const full = analyzeLoops(c.inputs, { sweepPoints: 300, responseSamples: 250 });
  it('loops in the order current, voltage, pll; optional parts null when their size is 0', () => {
    expect(full.loops.map((l) => l.id)).toEqual(['current', 'voltage', 'pll']);
    const bare = analyzeLoops(c.inputs, { sweepPoints: 0, responseSamples: 0 });
    expect(bare.openLoop).toBeNull();
    expect(bare.poleZero).toBeNull();
    expect(bare.time).toBeNull();
    expect(bare.loops).toEqual(full.loops.map((l) => ({ ...l, notes: l.notes })));
  });
  it('open-loop sweeps: log-spaced from 1 Hz to Nyquist, phase unwrapped', () => {
    for (const id of ['current', 'voltage', 'pll'] as const) {
      const s = full.openLoop![id];
      expect(s.frequencyHz).toHaveLength(300);
      expectClose(s.frequencyHz[0], 1, { rtol: 1e-12 }, 'start');
      expectClose(s.frequencyHz[299], 1 / (2 * c.inputs.samplePeriodS), { rtol: 1e-12 }, 'end');
      for (let i = 1; i < 300; i++) expect(Math.abs(s.phaseDeg[i] - s.phaseDeg[i - 1])).toBeLessThanOrEqual(180);
    }
  });
  it('current loop sweep agrees with the margins: |L| = 0 dB near the crossover', () => {
    const s = full.openLoop!.current;
    const fc = full.loops[0].crossoverHz as number;
    const i = s.frequencyHz.findIndex((f) => f > fc);
    expect(s.magnitudeDb[i - 1]).toBeGreaterThan(0);
    expect(s.magnitudeDb[i]).toBeLessThan(0);
  });
  it('JSON round trip is lossless (no NaN or Infinity)', () => {
    expect(JSON.parse(JSON.stringify(full))).toEqual(full);
  });
  it('a diverging loop truncates its time response and says so', () => {
    const unstable = analyzeLoops({ ...c.inputs, filter: { topology: 'L', inductanceH: 1e-3, resistanceOhm: 0 }, currentController: [{ b: [3e-3 / c.inputs.samplePeriodS, 0, 0], a: [1, 0, 0] }] }, { sweepPoints: 50, responseSamples: 5000 });
    expect(unstable.loops[0].stable).toBe(false);
    const step = unstable.time!['current-step'];
    expect(step.value.length).toBeLessThan(5000);
    expect(step.timeS).toHaveLength(step.value.length);
    expect(unstable.loops[0].notes?.some((n) => n.includes('diverges'))).toBe(true);
    expect(JSON.parse(JSON.stringify(unstable))).toEqual(unstable);
  });
});

describe('input validation', () => {
  const base = fixture.cases[0].inputs;
  const opts = { sweepPoints: 0, responseSamples: 0 };
  it.each([
    ['samplePeriodS', { samplePeriodS: 0 }],
    ['computationDelaySamples', { computationDelaySamples: 1.5 }],
    ['currentController', { currentController: [] }],
    ['currentController[0]', { currentController: [{ b: [1, 0, 0], a: [2, 0, 0] }] }],
    ['voltageController', { voltageController: { b: [Number.NaN, 0, 0], a: [1, -1, 0] } }],
    ['voltagePlantGain', { voltagePlantGain: -1 }],
    ['filter.inductanceH', { filter: { topology: 'L' as const, inductanceH: 0, resistanceOhm: 0 } }],
    ['filter.capacitanceF', { filter: { topology: 'LCL' as const, inverterInductanceH: 1e-3, gridInductanceH: 1e-3, capacitanceF: -1, dampingResistanceOhm: 1, resistanceOhm: 0 } }],
  ])('%s is named in the error', (path, patch) => {
    expect(() => analyzeLoops({ ...base, ...patch } as LoopInputs, opts)).toThrow(ControlError);
    expect(() => analyzeLoops({ ...base, ...patch } as LoopInputs, opts)).toThrow(path);
  });
  it('option sizes are validated', () => {
    expect(() => analyzeLoops(base, { sweepPoints: -1, responseSamples: 0 })).toThrow('options.sweepPoints');
    expect(() => analyzeLoops(base, { sweepPoints: 0, responseSamples: 0.5 })).toThrow('options.responseSamples');
  });
});
