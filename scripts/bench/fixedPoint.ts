// Fixed-point figures: throughput of the bit-exact Direct Form I model (ns per section-sample, 16
// and 32 bit) and the time to build the golden vectors of a six-block analysis with a 4-harmonic
// current controller (median and p95 over 20 runs, 2000 samples per vector). Numbers only.
import { quantizeSection, type AnalysisResult, type SectionKind, type SectionResult } from '../../shared/control/index';
import { goldenVectors, runFixedSection } from '../../shared/firmware/index';

const samplePeriodS = 1 / 32000;
const gridHz = 60;

/** Tustin prewarped at wp of (n2 s^2 + n1 s + n0) / (s^2 + d1 s + d0): s = K (z - 1)/(z + 1), K = wp / tan(wp Ts / 2). */
function prewarped(n: [number, number, number], d: [number, number], wpRadPerS: number): { b: number[]; a: number[] } {
  const k = wpRadPerS / Math.tan((wpRadPerS * samplePeriodS) / 2);
  const [n2, n1, n0] = n;
  const [d1, d0] = d;
  const a0 = k * k + d1 * k + d0;
  return {
    b: [(n2 * k * k + n1 * k + n0) / a0, (2 * (n0 - n2 * k * k)) / a0, (n2 * k * k - n1 * k + n0) / a0],
    a: [1, (2 * (d0 - k * k)) / a0, (k * k - d1 * k + d0) / a0],
  };
}

function section(role: string, kind: SectionKind, coefficients: { b: number[]; a: number[] }, wordBits: number, prewarpHz: number | null): SectionResult {
  return { role, kind, prewarpHz, ...coefficients, fixed: quantizeSection(coefficients.b, coefficients.a, wordBits) };
}

function analysis(wordBits: number): AnalysisResult {
  const w0 = 2 * Math.PI * gridHz;
  const wb = 2 * Math.PI * 0.5;
  const pi = (kp: number, ki: number) => ({ b: [kp + (ki * samplePeriodS) / 2, -kp + (ki * samplePeriodS) / 2, 0], a: [1, -1, 0] });
  const resonators = [1, 3, 5, 7].map((h, i) => section(`resonant-h${h}`, 'resonator', prewarped([0, 2 * [200, 50, 30, 20][i] * wb, 0], [2 * wb, (h * w0) ** 2], h * w0), wordBits, h * gridHz));
  const k = Math.SQRT2;
  const wc = 2 * Math.PI * 10;
  return {
    format: 'varsmith-analysis/1', sampleTimeS: samplePeriodS, loops: [], plant: {}, checks: [],
    blocks: [
      { id: 'voltage-pi', method: 'tustin', gains: {}, sections: [section('pi', 'pi', pi(0.8, 40), wordBits, null)] },
      { id: 'pll-pi', method: 'tustin', gains: {}, sections: [section('pi', 'pi', pi(153, 11760), wordBits, null)] },
      { id: 'current-pr', method: 'tustin-prewarp', gains: {}, sections: [section('proportional', 'gain', { b: [2.5, 0, 0], a: [1, 0, 0] }, wordBits, null), ...resonators] },
      { id: 'sogi-d', method: 'tustin-prewarp', gains: {}, sections: [section('band-pass', 'sogi-band-pass', prewarped([0, k * w0, 0], [k * w0, w0 * w0], w0), wordBits, gridHz)] },
      { id: 'sogi-q', method: 'tustin-prewarp', gains: {}, sections: [section('low-pass', 'sogi-low-pass', prewarped([0, 0, k * w0 * w0], [k * w0, w0 * w0], w0), wordBits, gridHz)] },
      { id: 'reactive-lpf', method: 'tustin-prewarp', gains: {}, sections: [section('low-pass', 'low-pass', prewarped([0, 0, wc * wc], [Math.SQRT2 * wc, wc * wc], wc), wordBits, null)] },
    ],
  };
}

function quantile(sorted: number[], q: number): number {
  return sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))];
}

/** @returns the figures. */
export async function run(): Promise<Record<string, unknown>> {
  const out: Record<string, unknown> = {};
  for (const wordBits of [16, 32]) {
    const a = analysis(wordBits);
    const resonator = a.blocks[2].sections[1].fixed;
    const max = 2 ** (wordBits - 1) - 1;
    const input = Array.from({ length: 200_000 }, (_, n) => Math.round(0.3 * max * Math.sin(n * 0.0118)));
    runFixedSection(resonator, input); // warm-up
    const t0 = performance.now();
    runFixedSection(resonator, input);
    const nsPerSample = ((performance.now() - t0) * 1e6) / input.length;
    const times: number[] = [];
    let vectorCount = 0;
    for (let i = 0; i < 21; i += 1) {
      const t = performance.now();
      vectorCount = goldenVectors(a, gridHz, { samples: 2000, seed: 1 }).length;
      if (i > 0) times.push(performance.now() - t);
    }
    times.sort((x, y) => x - y);
    out[`w${wordBits}`] = {
      modelNsPerSectionSample: Number(nsPerSample.toFixed(1)),
      goldenVectorsMedianMs: Number(quantile(times, 0.5).toFixed(2)),
      goldenVectorsP95Ms: Number(quantile(times, 0.95).toFixed(2)),
      vectors: vectorCount,
      samplesPerVector: 2000,
      runs: times.length,
    };
  }
  return out;
}
