// The averaged model with the double-precision controller against scipy: an independent Python
// implementation of the same state equations and control step, integrated by solve_ivp (DOP853,
// rtol 1e-11) between samples (tests/fixtures/scipy/generate_simulation.py -> simulation.json).
//
// Bound: what separates the two is the trapezoidal rule's truncation error, O(h^2) in the step h.
// Each case is run at the nominal step and at half of it (twice the substeps): the largest
// difference must shrink by 4 (accepted: 3 to 5), which an error in the equations would not do,
// and at the nominal step every trace must lie within 0.05 % of its scale (rated peak current for
// currents, nominal peak for the PCC voltage, the reference for the DC link, nominal frequency for
// the PLL, 1 for the modulation index). Measured at the nominal step: at most 0.02 %.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { perUnitBases, type DesignInput } from '../../../shared/control';
import { createReferenceController, designPlant, idleOperatingPoint, networkLayout, seriesLoadForPower, type SystemRunRecord } from '../../../shared/simulation';
import { expectClose } from '../../helpers/expectClose';
import { analysisOf, demoDesign, runPlant } from './helpers';

interface FixtureCase {
  name: string;
  design: string;
  shortCircuitRatio: number | null;
  loads: ('rl' | 'rc')[];
  durationS: number;
  initialState: number[];
  samples: number;
  stride: number;
  columns: string[];
  rows: number[][];
}
const fixture = JSON.parse(readFileSync(new URL('../../fixtures/scipy/simulation.json', import.meta.url), 'utf8')) as { cases: FixtureCase[] };

/** Fraction of each trace's scale the nominal step must meet. */
const BOUND_FRACTION = 5e-4;

function traceScales(design: DesignInput): Record<string, [string, number]> {
  const bases = perUnitBases(design);
  return {
    inverterCurrentA: ['inverterCurrentA', bases.currentBaseA],
    gridCurrentA: ['gridCurrentA', bases.currentBaseA],
    loadCurrentA: ['loadCurrentA', bases.currentBaseA],
    pccVoltageV: ['gridVoltageV', bases.voltageBaseV],
    dcLinkVoltageV: ['dcLinkVoltageV', design.dcLink.voltageRefV],
    pllFrequencyHz: ['pllFrequencyHz', design.grid.frequencyHz],
    reactiveCurrentEstimateA: ['reactiveCurrentEstimateA', bases.currentBaseA],
    modulationIndex: ['modulationIndex', 1],
  };
}

// Largest difference from the fixture over all traces, each divided by its scale.
function worstRelativeDifference(record: SystemRunRecord, c: FixtureCase, design: DesignInput): number {
  let worst = 0;
  for (const [column, [trace, scale]] of Object.entries(traceScales(design))) {
    const j = c.columns.indexOf(column);
    c.rows.forEach((row, i) => { worst = Math.max(worst, Math.abs(record.trace.columns[trace][i] - row[j]) / scale); });
  }
  return worst;
}

describe.each(fixture.cases.map((c) => [c.name, c] as const))('averaged model vs scipy solve_ivp: %s', (_name, c) => {
  const design = demoDesign(c.design);
  const analysis = analysisOf(design);
  const loads = c.loads.map((k) => seriesLoadForPower(design.grid.voltageRmsV, design.grid.frequencyHz, design.rating.apparentPowerVA, 0.8, k === 'rl' ? 'lagging' : 'leading'));
  const run = (substepsMin?: number): SystemRunRecord => runPlant({
    design,
    controller: createReferenceController(design, analysis, { coefficients: 'double', quantization: 'none' }),
    loads,
    shortCircuitRatio: c.shortCircuitRatio,
    samples: c.samples,
    traceStride: c.stride,
    substepsMin,
  });

  it('starts from the same idle steady state (hand-written phasors in the generator)', () => {
    const plant = designPlant(design, c.shortCircuitRatio, loads, null);
    const layout = networkLayout(plant);
    const op = idleOperatingPoint(plant, layout, { loadClosed: loads.map(() => true), rectifier: 'off' }, design.grid.voltageRmsV, design.grid.frequencyHz, design.dcLink.voltageRefV);
    expectClose(Array.from(op.state), c.initialState, { atol: 1e-9, rtol: 1e-12 }, 'initial state');
  });

  it(`follows every scipy trace within ${BOUND_FRACTION * 100} % of its scale at the nominal step`, () => {
    const record = run();
    expect(record.trace.count).toBe(c.rows.length);
    expectClose(Array.from(record.trace.timeS.subarray(0, record.trace.count)), c.rows.map((r) => r[0]), { atol: 1e-12 }, 'sample times');
    for (const [column, [trace, scale]] of Object.entries(traceScales(design))) {
      const j = c.columns.indexOf(column);
      expectClose(Array.from(record.trace.columns[trace].subarray(0, record.trace.count)), c.rows.map((r) => r[j]), { atol: BOUND_FRACTION * scale }, `${c.name} ${column}`);
    }
  });

  it('differs from scipy by the trapezoidal rule\'s O(h^2) error: halving the step divides it by about 4', () => {
    const nominal = run();
    const half = run(2 * nominal.substepsPerSample);
    const ratio = worstRelativeDifference(nominal, c, design) / worstRelativeDifference(half, c, design);
    expect(ratio, `error ratio for h -> h/2: ${ratio}`).toBeGreaterThan(3);
    expect(ratio).toBeLessThan(5);
  });
});
