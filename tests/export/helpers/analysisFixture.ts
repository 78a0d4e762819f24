import { quantizeSection, type AnalysisResult, type BlockResult, type DesignInput, type SectionKind, type SectionResult } from '../../../shared/control/index';

// Hand-built analysis for export tests while the full analysis pipeline is not available: the
// sections come from the continuous forms of CONTRACT section 2 discretized here with Tustin
// (prewarped where the contract says so), and the integers from the core's quantizeSection.
// Loops, plant and checks are placeholders shaped like the contract (only printed, never computed on).

/** Second-order continuous form N(s)/D(s) = (n2 s^2 + n1 s + n0)/(s^2 + d1 s + d0) under s = K (1 - z^-1)/(1 + z^-1) (bilinear map). */
function bilinear2(n: [number, number, number], d: [number, number], k: number): { b: number[]; a: number[] } {
  const [n2, n1, n0] = n;
  const [d1, d0] = d;
  const k2 = k * k;
  const a0 = k2 + d1 * k + d0;
  const b = [n2 * k2 + n1 * k + n0, 2 * n0 - 2 * n2 * k2, n2 * k2 - n1 * k + n0].map((x) => x / a0);
  const a = [1, (2 * d0 - 2 * k2) / a0, (k2 - d1 * k + d0) / a0];
  return { b, a };
}

/** First-order (n1 s + n0)/(s + d0) under the bilinear map. */
function bilinear1(n1: number, n0: number, d0: number, k: number): { b: number[]; a: number[] } {
  const a0 = k + d0;
  return { b: [(n1 * k + n0) / a0, (n0 - n1 * k) / a0, 0], a: [1, (d0 - k) / a0, 0] };
}

function section(role: string, kind: SectionKind, prewarpHz: number | null, tf: { b: number[]; a: number[] }, wordBits: number): SectionResult {
  return { role, kind, prewarpHz, b: tf.b, a: tf.a, fixed: quantizeSection(tf.b, tf.a, wordBits) };
}

/**
 * Analysis-shaped fixture of a design (CONTRACT section 2 forms; gains from the design or simple rules).
 *
 * @param design - a design.
 * @returns an analysis result with every block and quantized section.
 */
export function analysisFixture(design: DesignInput): AnalysisResult {
  const ts = 1 / (design.sampling.switchingFrequencyHz * design.sampling.updatesPerCarrier);
  const w = design.fixedPoint.wordBits;
  const w0 = 2 * Math.PI * design.grid.frequencyHz;
  const pi = (kp: number, ki: number) => ({ b: [kp + (ki * ts) / 2, (ki * ts) / 2 - kp, 0], a: [1, -1, 0] });
  const warp = (wp: number) => wp / Math.tan((wp * ts) / 2);
  const kv = (Math.SQRT2 * design.grid.voltageRmsV) / (2 * design.dcLink.capacitanceF * design.dcLink.voltageRefV);
  const wcV = 2 * Math.PI * design.voltageLoop.crossoverHz;
  const pm = (design.voltageLoop.phaseMarginDeg * Math.PI) / 180;
  const vKp = design.voltageLoop.kp ?? (wcV * Math.sin(pm)) / kv;
  const vKi = design.voltageLoop.ki ?? (vKp * wcV) / Math.tan(pm);
  const wn = 4.6 / (design.pll.dampingRatio * design.pll.settlingTimeS);
  const pKp = design.pll.kp ?? 2 * design.pll.dampingRatio * wn;
  const pKi = design.pll.ki ?? wn * wn;
  const l = design.filter.topology === 'L' ? design.filter.inductanceH : design.filter.inverterInductanceH + design.filter.gridInductanceH;
  const cKp = design.currentLoop.kp ?? 2 * Math.PI * design.currentLoop.crossoverHz * l;
  const krs = design.currentLoop.resonantGains ?? design.currentLoop.harmonics.map(() => cKp * 20);
  const wb = 2 * Math.PI * design.currentLoop.resonantBandwidthHz;
  const k = design.pll.sogiGain;
  const wc = 2 * Math.PI * design.reactiveFilter.cutoffHz;
  const blocks: BlockResult[] = [
    { id: 'voltage-pi', method: 'tustin', gains: { kp: vKp, ki: vKi }, sections: [section('pi', 'pi', null, pi(vKp, vKi), w)] },
    { id: 'pll-pi', method: 'tustin', gains: { kp: pKp, ki: pKi }, sections: [section('pi', 'pi', null, pi(pKp, pKi), w)] },
    {
      id: 'current-pr', method: 'tustin-prewarp', gains: { kp: cKp, resonantGains: krs },
      sections: [
        section('proportional', 'gain', null, { b: [cKp, 0, 0], a: [1, 0, 0] }, w),
        ...design.currentLoop.harmonics.map((h, i) => {
          const wh = h * w0;
          const tf = wb > 0 ? bilinear2([0, 2 * krs[i] * wb, 0], [2 * wb, wh * wh], warp(wh)) : bilinear2([0, krs[i], 0], [0, wh * wh], warp(wh));
          return section(`resonant-h${h}`, 'resonator', h * design.grid.frequencyHz, tf, w);
        }),
      ],
    },
    { id: 'sogi-d', method: 'tustin-prewarp', gains: { k }, sections: [section('band-pass', 'sogi-band-pass', design.grid.frequencyHz, bilinear2([0, k * w0, 0], [k * w0, w0 * w0], warp(w0)), w)] },
    { id: 'sogi-q', method: 'tustin-prewarp', gains: { k }, sections: [section('low-pass', 'sogi-low-pass', design.grid.frequencyHz, bilinear2([0, 0, k * w0 * w0], [k * w0, w0 * w0], warp(w0)), w)] },
    {
      id: 'reactive-lpf', method: 'tustin-prewarp', gains: { cutoffHz: design.reactiveFilter.cutoffHz },
      sections: [section('low-pass', 'low-pass', design.reactiveFilter.cutoffHz, design.reactiveFilter.order === 1 ? bilinear1(0, wc, wc, warp(wc)) : bilinear2([0, 0, wc * wc], [Math.SQRT2 * wc, wc * wc], warp(wc)), w)],
    },
  ];
  return {
    format: 'varsmith-analysis/1',
    sampleTimeS: ts,
    blocks,
    loops: [{ id: 'current', crossoverHz: design.currentLoop.crossoverHz, phaseMarginDeg: 50, gainMarginDb: 8, peakSensitivity: 1.6, closedLoopPoles: [], maxPoleRadius: 0.98, stable: true }],
    plant: {},
    checks: [{ id: 'fixture-info', severity: 'info', message: 'hand-built analysis fixture | pipes escaped', value: null, limit: null, unit: null }],
  };
}

/** Demo-like designs not in the repository (invented values): L 32-bit, LCL 16-bit. */
export const L32_DESIGN: DesignInput = {
  format: 'varsmith-design/1',
  name: 'Harbour test rig A',
  grid: { voltageRmsV: 120, frequencyHz: 60 },
  rating: { apparentPowerVA: 3300 },
  filter: { topology: 'L', inductanceH: 0.0006, resistanceOhm: 0.03 },
  dcLink: { capacitanceF: 0.0022, voltageRefV: 200 },
  sampling: { switchingFrequencyHz: 20000, updatesPerCarrier: 1, computationDelaySamples: 1 },
  currentLoop: { crossoverHz: 1000, harmonics: [1, 3, 5, 7], resonantBandwidthHz: 0.5, kp: null, resonantGains: null },
  voltageLoop: { crossoverHz: 12, phaseMarginDeg: 60, kp: null, ki: null },
  pll: { sogiGain: Math.SQRT2, settlingTimeS: 0.06, dampingRatio: 0.7071, kp: null, ki: null },
  reactiveFilter: { order: 2, cutoffHz: 10 },
  fixedPoint: { wordBits: 32 },
};

/** LCL, 16-bit, 50 Hz, name starting with a digit (C prefix rule). */
export const LCL16_DESIGN: DesignInput = {
  format: 'varsmith-design/1',
  name: '3kW island-grid LCL/16',
  grid: { voltageRmsV: 230, frequencyHz: 50 },
  rating: { apparentPowerVA: 3000 },
  filter: { topology: 'LCL', inverterInductanceH: 0.0018, gridInductanceH: 0.0007, capacitanceF: 4.7e-6, dampingResistanceOhm: 2.2, resistanceOhm: 0.08 },
  dcLink: { capacitanceF: 0.0015, voltageRefV: 400 },
  sampling: { switchingFrequencyHz: 16000, updatesPerCarrier: 2, computationDelaySamples: 1 },
  currentLoop: { crossoverHz: 800, harmonics: [1, 3, 5], resonantBandwidthHz: 0, kp: null, resonantGains: null },
  voltageLoop: { crossoverHz: 10, phaseMarginDeg: 55, kp: null, ki: null },
  pll: { sogiGain: 1.2, settlingTimeS: 0.08, dampingRatio: 0.8, kp: null, ki: null },
  reactiveFilter: { order: 1, cutoffHz: 5 },
  fixedPoint: { wordBits: 16 },
};
