// Scaling to per-unit signals (CONTRACT section 7) leaves every loop as it was: the per-unit loop
// is C_pu(z) G_pu(z) = (g C(z)) (G(z) / g) = C(z) G(z). Checked by rebuilding each loop from the
// analysis' `scaled` sections and the plant written in per unit (impedances times g, integrator
// gains times the bases), independently of how analyzeDesign computes its SI loops; a wrong g
// moves the crossover and the margins.
import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import {
  analyzeDesign, analyzeLoops, loopMargins, perUnitBases,
  type AnalysisResult, type DesignInput, type FilterInput, type LoopResult,
} from '../../shared/control';
import { sectionResponse } from '../../shared/control/blocks';
import { expectClose } from '../helpers/expectClose';

const dir = new URL('../../examples/', import.meta.url);
const designs = readdirSync(dir).filter((f) => f.endsWith('.json')).sort().map((f) => [f, JSON.parse(readFileSync(new URL(f, dir), 'utf8')) as DesignInput] as const);
const NONE = { sweepPoints: 0, responseSamples: 0 };

function scaledFilter(filter: FilterInput, g: number): FilterInput {
  if (filter.topology === 'L') return { ...filter, inductanceH: g * filter.inductanceH, resistanceOhm: g * filter.resistanceOhm };
  return {
    ...filter,
    inverterInductanceH: g * filter.inverterInductanceH, gridInductanceH: g * filter.gridInductanceH,
    capacitanceF: filter.capacitanceF / g, dampingResistanceOhm: g * filter.dampingResistanceOhm, resistanceOhm: g * filter.resistanceOhm,
  };
}

// The three loops rebuilt in per unit from the scaled sections of a per-unit analysis.
function perUnitLoops(design: DesignInput, analysis: AnalysisResult): { current: LoopResult; voltage: LoopResult; pll: { crossoverHz: number | null; phaseMarginDeg: number | null; gainMarginDb: number | null; peakSensitivity: number } } {
  const b = perUnitBases(design);
  const scaled = (id: string) => analysis.blocks.find((x) => x.id === id)!.sections.map((s) => ({ b: s.scaled!.b, a: s.scaled!.a }));
  const gCurrent = b.currentBaseA / b.dcVoltageBaseV;
  const voltage = analysis.blocks.find((x) => x.id === 'voltage-pi')!;
  const kv = voltage.gains.plantGain as number;
  const loops = analyzeLoops({
    samplePeriodS: analysis.sampleTimeS,
    computationDelaySamples: design.sampling.computationDelaySamples,
    // plant input: converter voltage in pu of VdcBase; output: current in pu of Ibase
    filter: scaledFilter(design.filter, gCurrent),
    currentController: scaled('current-pr'),
    voltageController: scaled('voltage-pi')[0],
    // active current in pu of Ibase in, DC-link voltage in pu of VdcBase out
    voltagePlantGain: (kv * b.currentBaseA) / b.dcVoltageBaseV,
    pllController: scaled('pll-pi')[0],
  }, NONE).loops;
  // PLL: the PI gives the frequency deviation in pu of wBase; the angle integrates wBase * that.
  const pll = scaled('pll-pi')[0];
  const ts = analysis.sampleTimeS;
  const margins = loopMargins((w) => {
    const c = sectionResponse(pll, w / (2 * Math.PI), ts);
    const dr = Math.cos(w * ts) - 1;
    const di = Math.sin(w * ts);
    const m = dr * dr + di * di;
    const pr = (b.angularFrequencyBaseRadPerS * ts * dr) / m;
    const pi = (-b.angularFrequencyBaseRadPerS * ts * di) / m;
    return { re: c.re * pr - c.im * pi, im: c.re * pi + c.im * pr };
  }, ts, []);
  return { current: loops[0], voltage: loops[1], pll: margins };
}

describe('loop margins are the same in SI and per unit', () => {
  it.each(designs.map(([f, d]) => [f, d] as const))('%s: the per-unit loops of the scaled sections have the SI margins and poles', (_file, design) => {
    const pu = analyzeDesign(design, NONE);
    const si = analyzeDesign({ ...design, signals: { units: 'si' } }, NONE);
    // the analysis' own loops do not depend on the units
    expect(pu.loops).toEqual(si.loops);
    const rebuilt = perUnitLoops(design, pu);
    for (const [id, got] of [['current', rebuilt.current], ['voltage', rebuilt.voltage], ['pll', rebuilt.pll]] as const) {
      const want = si.loops.find((l) => l.id === id)!;
      expectClose(got.crossoverHz ?? NaN, want.crossoverHz ?? NaN, { rtol: 1e-9 }, `${id} crossover`);
      expectClose(got.phaseMarginDeg ?? NaN, want.phaseMarginDeg ?? NaN, { atol: 1e-7 }, `${id} phase margin`);
      if (want.gainMarginDb !== null) expectClose(got.gainMarginDb ?? NaN, want.gainMarginDb, { atol: 1e-7 }, `${id} gain margin`);
      expectClose(got.peakSensitivity, want.peakSensitivity, { rtol: 1e-9 }, `${id} Ms`);
    }
    expectClose(rebuilt.current.maxPoleRadius, si.loops[0].maxPoleRadius, { atol: 1e-9 }, 'current max pole radius');
    expectClose(rebuilt.voltage.maxPoleRadius, si.loops[1].maxPoleRadius, { atol: 1e-9 }, 'voltage max pole radius');
  });

  it('a wrong g would show: the per-unit PR on the SI plant moves the current-loop crossover', () => {
    const [, design] = designs.find(([f]) => f.startsWith('sc3'))!;
    const pu = analyzeDesign(design, NONE);
    const wrong = analyzeLoops({
      samplePeriodS: pu.sampleTimeS, computationDelaySamples: 1, filter: design.filter,
      currentController: pu.blocks.find((x) => x.id === 'current-pr')!.sections.map((s) => ({ b: s.scaled!.b, a: s.scaled!.a })),
      voltageController: pu.blocks[0].sections[0], voltagePlantGain: 1, pllController: pu.blocks[1].sections[0],
    }, NONE).loops[0];
    expect(Math.abs((wrong.crossoverHz ?? 0) - (pu.loops[0].crossoverHz ?? 0))).toBeGreaterThan(100);
  });
});
