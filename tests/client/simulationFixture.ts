// A small real simulation result (SC-3 bench unit, steady, 10 cycles, 60 trace points) for the client tests.
import { parseDesign } from '../../shared/api/design';
import sc3 from '../../examples/sc3-bench-l-120v.json';
import { analyzeDesign, type DesignInput } from '../../shared/control';
import { defaultSimulationOptions, simulateScenario, type SimulationOptions, type SimulationResult } from '../../shared/simulation';

let cached: SimulationResult | null = null;

/** The SC-3 demo design. */
export function sc3Design(): DesignInput {
  const parsed = parseDesign(JSON.parse(JSON.stringify(sc3)));
  if (!parsed.ok) throw new Error('SC-3 does not parse');
  return parsed.design;
}

/** A steady run of SC-3 (computed once per test file). */
export function buildSimulationResult(patch: Partial<SimulationOptions> = {}): SimulationResult {
  if (cached && Object.keys(patch).length === 0) return cached;
  const design = sc3Design();
  const result = simulateScenario(design, analyzeDesign(design, { sweepPoints: 0, responseSamples: 0 }), { ...defaultSimulationOptions('steady'), durationS: 10 / 60, tracePoints: 60, ...patch });
  if (Object.keys(patch).length === 0) cached = result;
  return result;
}
