// Shared set-up of the simulation tests: demo designs, their analyses, a plant run with any controller.
import { readFileSync } from 'node:fs';
import { parseDesign } from '../../../shared/api/design';
import { analyzeDesign, type AnalysisResult, type DesignInput } from '../../../shared/control';
import {
  designPlant, designSensing, idleCompares, idleOperatingPoint, networkLayout, runSystem,
  type BridgeModel, type LoadBranch, type Quantization, type SampledController, type SystemRunRecord,
} from '../../../shared/simulation';

/** The demo designs of examples/. */
export const DEMO_FILES = ['sc3-bench-l-120v.json', 'sc5-field-lcl-240v.json', 'sc2-port-16bit-230v.json'];

/** A demo design, validated. */
export function demoDesign(file: string): DesignInput {
  const parsed = parseDesign(JSON.parse(readFileSync(new URL(`../../../examples/${file}`, import.meta.url), 'utf8')));
  if (!parsed.ok) throw new Error(`${file} does not parse`);
  return parsed.design;
}

/** Analysis without plot data. */
export function analysisOf(design: DesignInput): AnalysisResult {
  return analyzeDesign(design, { sweepPoints: 0, responseSamples: 0 });
}

/** Options of {@link runPlant}. */
export interface PlantRun {
  design: DesignInput;
  controller: SampledController;
  loads: LoadBranch[];
  shortCircuitRatio: number | null;
  samples: number;
  model?: BridgeModel;
  quantization?: Quantization;
  /** Source amplitude over nominal (0 = no grid voltage). */
  amplitudeScale?: number;
  /** Replace the DC-link capacitance (a huge one holds the DC voltage). */
  dcLinkCapacitanceF?: number;
  traceStride?: number;
  substepsMin?: number;
}

/** Runs the closed loop from the idle operating point with no warm-up, recording from sample 0. */
export function runPlant(o: PlantRun): SystemRunRecord {
  const d = o.design;
  const plant = designPlant(d, o.shortCircuitRatio, o.loads, null);
  if (o.dcLinkCapacitanceF !== undefined) plant.dcLink = { capacitanceF: o.dcLinkCapacitanceF, lossResistanceOhm: null };
  const layout = networkLayout(plant);
  const mode = { loadClosed: o.loads.map(() => true), rectifier: 'off' as const };
  const scale = o.amplitudeScale ?? 1;
  const op = idleOperatingPoint(plant, layout, mode, d.grid.voltageRmsV * scale, d.grid.frequencyHz, d.dcLink.voltageRefV);
  const samplePeriodS = 1 / (d.sampling.switchingFrequencyHz * d.sampling.updatesPerCarrier);
  const quantization = o.quantization ?? 'none';
  o.controller.reset();
  return runSystem({
    plant,
    source: { voltageRmsV: d.grid.voltageRmsV, harmonics: [], segments: [{ fromS: 0, frequencyHz: d.grid.frequencyHz, amplitudeScale: scale }] },
    sensing: designSensing(d),
    switchingFrequencyHz: d.sampling.switchingFrequencyHz,
    updatesPerCarrier: d.sampling.updatesPerCarrier,
    computationDelaySamples: d.sampling.computationDelaySamples,
    model: o.model ?? 'averaged',
    quantization,
    controller: o.controller,
    initialState: op.state,
    initialMode: mode,
    initialCompares: idleCompares(op, d, samplePeriodS, quantization),
    loadEvents: [],
    warmupSamples: 0,
    samples: o.samples,
    traceStride: o.traceStride ?? 1,
    windowStartS: o.samples * samplePeriodS - 5 / d.grid.frequencyHz,
    nominalFrequencyHz: d.grid.frequencyHz,
    substepsMin: o.substepsMin,
  });
}
