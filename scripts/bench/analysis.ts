// Full analysis of the 4-harmonic LCL demo design with plot data (2 000-point sweeps per loop,
// 2 000-sample time responses), 200 runs after a warm-up: median and p95 in milliseconds.
import { readFileSync } from 'node:fs';
import { analyzeDesign } from '../../shared/control';
import { parseDesign } from '../../shared/api/design';

/** Runs the benchmark and returns its figures. */
export async function run(): Promise<Record<string, unknown>> {
  const parsed = parseDesign(JSON.parse(readFileSync(new URL('../../examples/sc5-field-lcl-240v.json', import.meta.url), 'utf8')));
  if (!parsed.ok) throw new Error('demo design invalid');
  const options = { sweepPoints: 2000, responseSamples: 2000 };
  for (let i = 0; i < 20; i++) analyzeDesign(parsed.design, options);
  const times: number[] = [];
  for (let i = 0; i < 200; i++) {
    const t0 = performance.now();
    analyzeDesign(parsed.design, options);
    times.push(performance.now() - t0);
  }
  times.sort((a, b) => a - b);
  const bare: number[] = [];
  for (let i = 0; i < 200; i++) {
    const t0 = performance.now();
    analyzeDesign(parsed.design, { sweepPoints: 0, responseSamples: 0 });
    bare.push(performance.now() - t0);
  }
  bare.sort((a, b) => a - b);
  return {
    design: parsed.design.name,
    runs: 200,
    sweepPoints: 2000,
    responseSamples: 2000,
    medianMs: +times[100].toFixed(3),
    p95Ms: +times[190].toFixed(3),
    targetMedianMs: 5,
    withoutPlotData: { medianMs: +bare[100].toFixed(3), p95Ms: +bare[190].toFixed(3) },
  };
}
