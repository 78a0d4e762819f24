// The simulated small-signal current step against the linear loop's step response of the analysis
// (shared/control: C_pr(z) z^-d G(z), G the zero-order-hold filter admittance, CONTRACT section 3).
//
// Set-up: no grid voltage (the PCC is shorted, as the loop analysis takes the LCL's grid side), no
// load, a DC link held at its reference (huge capacitance), and a controller that runs only the
// designed PR sections on the sensed current: m = PR(1 A - i) / V_dc. Then the averaged bridge
// applies exactly the controller's voltage, held for a sample, after the computation delay: the
// sampled loop of the analysis. What remains is the trapezoidal rule against the exact zero-order
// hold: the relative error of a mode at w is (w h)^2 / 12; the fastest mode of the loop is near the
// current-loop crossover w_c (and an LCL's resonance), so we run at a quarter of the nominal step
// and allow (w h)^2 / 12 of the 1 A step with w the larger of the two.
import { describe, expect, it } from 'vitest';
import { analyzeDesign, type DesignInput } from '../../../shared/control';
import { Df1Section, designSensing, unipolarCompares, type SampledController } from '../../../shared/simulation';
import { expectClose } from '../../helpers/expectClose';
import { demoDesign, runPlant } from './helpers';

function prOnlyController(design: DesignInput, sections: { b: number[]; a: number[] }[], referenceA: number): SampledController {
  const sensing = designSensing(design);
  const filters = sections.map((s) => new Df1Section(s.b, s.a));
  return {
    reset: () => filters.forEach((f) => f.reset()),
    step: (codes) => {
      const e = referenceA - codes.inverterCurrent * sensing.currentAPerCode;
      let v = 0;
      for (const f of filters) v += f.step(e);
      return { ...unipolarCompares(v / design.dcLink.voltageRefV, sensing.carrierCounts, 'none'), log: {} };
    },
  };
}

describe.each([['SC-3 (L)', 'sc3-bench-l-120v.json'], ['SC-5 (LCL, double update)', 'sc5-field-lcl-240v.json'], ['SC-2 (L, 230 V)', 'sc2-port-16bit-230v.json']])('%s', (_name, file) => {
  it('a 1 A current-reference step follows the analysed loop\'s step response', () => {
    const design = demoDesign(file);
    const samples = 400;
    const analysis = analyzeDesign(design, { sweepPoints: 0, responseSamples: samples });
    const linear = analysis.responses?.time['current-step'];
    if (!linear) throw new Error('no current-step response');
    const pr = analysis.blocks.find((b) => b.id === 'current-pr');
    if (!pr) throw new Error('no current-pr block');
    const controller = prOnlyController(design, pr.sections.map((s) => ({ b: s.b, a: s.a })), 1);
    const record = runPlant({ design, controller, loads: [], shortCircuitRatio: null, samples, amplitudeScale: 0, dcLinkCapacitanceF: 1e6, substepsMin: 4 });
    const simulated = Array.from(record.trace.columns.inverterCurrentA.subarray(0, samples));
    const f = design.filter;
    const resonanceRadPerS = f.topology === 'LCL'
      ? Math.sqrt((f.inverterInductanceH + f.gridInductanceH) / (f.inverterInductanceH * f.gridInductanceH * f.capacitanceF))
      : 0;
    const w = Math.max(2 * Math.PI * design.currentLoop.crossoverHz, resonanceRadPerS);
    const h = record.samplePeriodS / record.substepsPerSample;
    const bound = (w * h) ** 2 / 12;
    expect(bound).toBeLessThan(0.01);
    expectClose(simulated, linear.value.slice(0, samples), { atol: bound }, 'inverter current (A) after a 1 A step');
    // It is a real step response: it rises to the reference.
    expectClose(simulated[samples - 1], 1, { atol: 0.05 }, 'settled value');
  });
});
