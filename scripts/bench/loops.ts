// Loop analysis figures: one analyzeLoops call of a 4-harmonic LCL design (margins of the three
// loops, closed-loop poles, 2000-point open-loop sweeps, 2000-sample step responses), median and
// p95 over 200 runs after 20 warm-up runs, plus the margins-only call (no plot data). Numbers only.
import { analyzeLoops, tustinPrewarp, transferFunction, type LoopInputs } from '../../shared/control/index';

const samplePeriodS = 1 / 32000;
const w0 = 2 * Math.PI * 60;
const wb = 2 * Math.PI * 0.5;
const pi = (kp: number, ki: number) => ({ b: [kp + (ki * samplePeriodS) / 2, -kp + (ki * samplePeriodS) / 2, 0], a: [1, -1, 0] });
const resonators = [1, 3, 5, 7].map((h, i) => {
  const tf = tustinPrewarp(transferFunction([2 * [200, 50, 30, 20][i] * wb, 0], [1, 2 * wb, (h * w0) ** 2], { kind: 'continuous' }), samplePeriodS, h * w0);
  return { b: tf.num, a: tf.den };
});
const inputs: LoopInputs = {
  samplePeriodS,
  computationDelaySamples: 1,
  filter: { topology: 'LCL', inverterInductanceH: 0.4e-3, gridInductanceH: 0.2e-3, capacitanceF: 4.7e-6, dampingResistanceOhm: 1.5, resistanceOhm: 0.05 },
  currentController: [{ b: [2 * Math.PI * 1000 * 0.6e-3, 0, 0], a: [1, 0, 0] }, ...resonators],
  voltageController: pi(0.8, 40),
  voltagePlantGain: 190,
  pllController: pi(153, 11760),
};

function stats(times: number[]): { medianMs: number; p95Ms: number; minMs: number } {
  const s = times.slice().sort((a, b) => a - b);
  return { medianMs: Number(s[Math.floor(s.length / 2)].toFixed(3)), p95Ms: Number(s[Math.floor(s.length * 0.95)].toFixed(3)), minMs: Number(s[0].toFixed(3)) };
}

function time(options: { sweepPoints: number; responseSamples: number }, runs: number): number[] {
  const out: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = performance.now();
    analyzeLoops(inputs, options);
    out.push(performance.now() - t0);
  }
  return out;
}

/** Runs the loop-analysis benchmark. */
export async function run(): Promise<Record<string, unknown>> {
  const full = { sweepPoints: 2000, responseSamples: 2000 };
  const bare = { sweepPoints: 0, responseSamples: 0 };
  time(full, 20);
  const result = analyzeLoops(inputs, full);
  return {
    design: '4-harmonic LCL, 32 kHz, one sample of delay',
    runs: 200,
    fullAnalysis: stats(time(full, 200)),
    marginsAndPolesOnly: stats(time(bare, 200)),
    closedLoopPoles: result.loops.map((l) => l.closedLoopPoles.length),
    stable: result.loops.map((l) => l.stable),
  };
}
