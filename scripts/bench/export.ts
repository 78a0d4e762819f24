// Export figures: time to build the bundle (golden vectors, templates, manifest, zip) of a design
// with a 4-harmonic current controller, 16 and 32 bit; median and p95 over 20 exports after one
// warm-up, also with the analysis included (what `varsmith export` does). Target: median <= 300 ms.
import { analyzeDesign, type DesignInput } from '../../shared/control/index';
import { buildBundle } from '../../server/export/index';
import { contractExampleDesign } from '../../shared/api/designExample';

const DESIGN: DesignInput = contractExampleDesign('Bench rig, four harmonics');

const RUNS = 20;

function stats(ms: number[]): { medianMs: number; p95Ms: number; minMs: number } {
  const s = [...ms].sort((a, b) => a - b);
  const round = (v: number): number => Math.round(v * 10) / 10;
  return { medianMs: round(s[Math.floor((s.length - 1) / 2)]), p95Ms: round(s[Math.ceil(0.95 * s.length) - 1]), minMs: round(s[0]) };
}

/**
 * Median over 20 exports of a 4-harmonic design (bundle only, and analysis plus bundle), 16 and 32 bit.
 *
 * @returns the figures in milliseconds and the bundle size in bytes.
 */
export async function run(): Promise<Record<string, unknown>> {
  const out: Record<string, unknown> = { runs: RUNS, targetMedianMs: 300 };
  for (const wordBits of [32, 16] as const) {
    const design: DesignInput = { ...DESIGN, fixedPoint: { wordBits } };
    const options = { sweepPoints: 0, responseSamples: 0 };
    const base = { version: '1.0.0', revision: 1, createdAt: new Date('2026-01-01T00:00:00Z'), draft: false, toolVersion: 'bench' };
    const analysis = analyzeDesign(design, options);
    const warm = await buildBundle({ design, analysis, ...base });
    const bundleMs: number[] = [];
    const totalMs: number[] = [];
    for (let i = 0; i < RUNS; i += 1) {
      let t = performance.now();
      await buildBundle({ design, analysis, ...base });
      bundleMs.push(performance.now() - t);
      t = performance.now();
      await buildBundle({ design, analysis: analyzeDesign(design, options), ...base });
      totalMs.push(performance.now() - t);
    }
    out[`bundle${wordBits}`] = { ...stats(bundleMs), zipBytes: warm.zip.length };
    out[`analyzeAndBundle${wordBits}`] = stats(totalMs);
  }
  return out;
}
