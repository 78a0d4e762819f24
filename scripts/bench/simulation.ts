// Whole-system simulation figures: wall time for 1 s of simulated time, averaged and switched
// bridge, on the demo designs (the closed loop from the idle operating point, no warm-up, double
// reference controller), median of 3 runs after 2 warm-up runs; and, in the same bench run, the same
// averaged SC-3 case in scipy (tests/fixtures/scipy/generate_simulation.py --bench 1: the same
// equations integrated by solve_ivp between samples). Numbers only.
import { execFileSync } from 'node:child_process';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { parseDesign } from '../../shared/api/design';
import { analyzeDesign, type DesignInput } from '../../shared/control/index';
import {
  createReferenceController, designPlant, designSensing, idleCompares, idleOperatingPoint, networkLayout, runSystem, seriesLoadForPower,
  type BridgeModel,
} from '../../shared/simulation/index';

const root = fileURLToPath(new URL('../../', import.meta.url));

function design(file: string): DesignInput {
  const parsed = parseDesign(JSON.parse(readFileSync(`${root}examples/${file}`, 'utf8')));
  if (!parsed.ok) throw new Error(`${file} does not parse`);
  return parsed.design;
}

// One second of the steady case (R-L load at 0.8 lagging, stiff grid) from the idle operating point.
function oneSecond(d: DesignInput, model: BridgeModel): number {
  const analysis = analyzeDesign(d, { sweepPoints: 0, responseSamples: 0 });
  const loads = [seriesLoadForPower(d.grid.voltageRmsV, d.grid.frequencyHz, d.rating.apparentPowerVA, 0.8, 'lagging')];
  const plant = designPlant(d, null, loads, null);
  const layout = networkLayout(plant);
  const mode = { loadClosed: [true], rectifier: 'off' as const };
  const op = idleOperatingPoint(plant, layout, mode, d.grid.voltageRmsV, d.grid.frequencyHz, d.dcLink.voltageRefV);
  const controller = createReferenceController(d, analysis, { coefficients: 'double', quantization: 'none' });
  const samples = Math.round(1 / analysis.sampleTimeS);
  const t0 = performance.now();
  runSystem({
    plant, source: { voltageRmsV: d.grid.voltageRmsV, harmonics: [], segments: [{ fromS: 0, frequencyHz: d.grid.frequencyHz, amplitudeScale: 1 }] },
    sensing: designSensing(d), switchingFrequencyHz: d.sampling.switchingFrequencyHz, updatesPerCarrier: d.sampling.updatesPerCarrier,
    computationDelaySamples: d.sampling.computationDelaySamples, model, quantization: 'none', controller, initialState: op.state, initialMode: mode,
    initialCompares: idleCompares(op, d, analysis.sampleTimeS, 'none'), loadEvents: [], warmupSamples: 0, samples, traceStride: 100,
    windowStartS: 1 - 5 / d.grid.frequencyHz, nominalFrequencyHz: d.grid.frequencyHz,
  });
  return performance.now() - t0;
}

function median(d: DesignInput, model: BridgeModel): number {
  for (let i = 0; i < 2; i++) oneSecond(d, model);
  const times = [0, 1, 2].map(() => oneSecond(d, model)).sort((a, b) => a - b);
  return Number(times[1].toFixed(1));
}

function scipySeconds(): { wallS: number | null; note: string } {
  try {
    const out = execFileSync('python3', [`${root}tests/fixtures/scipy/generate_simulation.py`, '--bench', '1'], { encoding: 'utf8', timeout: 600000 });
    const parsed = JSON.parse(out.trim()) as { wallS: number; method: string };
    return { wallS: Number(parsed.wallS.toFixed(2)), note: parsed.method };
  } catch (err) {
    return { wallS: null, note: `scipy run unavailable: ${(err as Error).message.split('\n')[0]}` };
  }
}

/** Runs the simulation benchmark. */
export async function run(): Promise<Record<string, unknown>> {
  const out: Record<string, unknown> = {};
  for (const file of ['sc3-bench-l-120v.json', 'sc5-field-lcl-240v.json', 'sc2-port-16bit-230v.json']) {
    const d = design(file);
    out[file.replace(/\.json$/, '')] = { averagedMsPerSimulatedS: median(d, 'averaged'), switchedMsPerSimulatedS: median(d, 'switched') };
  }
  const sc3AveragedMs = (out['sc3-bench-l-120v'] as { averagedMsPerSimulatedS: number }).averagedMsPerSimulatedS;
  const scipy = scipySeconds();
  out.scipySc3AveragedSPerSimulatedS = scipy.wallS;
  out.scipyMethod = scipy.note;
  out.speedupOverScipy = scipy.wallS === null ? null : Number(((scipy.wallS * 1000) / sc3AveragedMs).toFixed(1));
  return out;
}
