// Anti-windup of the limited PI against the reference simulation of the same clamped difference
// equations (tests/fixtures/scipy/antiwindup.json, generate_antiwindup.py: Python integers and numpy
// float32): a DC-link loop whose load exceeds the current-reference clamp for 300 samples. The
// firmware step gives the same output trace bit for bit, and with conditional integration the link
// voltage is back within 2 % in less than half the samples it takes without (Åström & Hägglund,
// "Advanced PID Control", 2006, integrator windup). Also: the PR limit holds every resonator state
// bounded, the PLL clamp is never exceeded.
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { analyzeDesign, perUnitBases, quantizeValue, type DesignInput } from '../../shared/control';
import {
  createBlockState, createPiState, firmwareSet, limitVectors, resetPiState, stepBlock, stepPi,
  type AntiWindup, type FirmwareSet,
} from '../../shared/firmware';

interface Run {
  arithmetic: 'fixed' | 'float32';
  wordBits: number;
  antiWindup: AntiWindup;
  taps: Record<string, number>;
  limit: string;
  sha256: string;
  every250: string[];
  recoverySamples: number | null;
  saturatedSamples: number;
  maximumVoltagePu: number;
}
const fixture = JSON.parse(readFileSync(new URL('../fixtures/scipy/antiwindup.json', import.meta.url), 'utf8')) as {
  design: DesignInput; phases: { settle: number; saturate: number; recover: number }; loadsPu: [number, number, number]; bandPu: number; runs: Run[];
};

const view = new DataView(new ArrayBuffer(4));
const bitsText = (v: number): string => { view.setFloat32(0, v); return String(view.getUint32(0)); };

function setFor(arithmetic: 'fixed' | 'float32', wordBits: 16 | 32): { set: FirmwareSet; design: DesignInput } {
  const design: DesignInput = { ...fixture.design, fixedPoint: { wordBits, arithmetic } };
  return { set: firmwareSet(design, analyzeDesign(design, { sweepPoints: 0, responseSamples: 0 })), design };
}

// The loop of the fixture, stepped by the firmware PI (plant in binary64, same operation order).
function simulate(arithmetic: 'fixed' | 'float32', wordBits: 16 | 32, antiWindup: AntiWindup) {
  const { set, design } = setFor(arithmetic, wordBits);
  const b = perUnitBases(design);
  const ts = 1 / (design.sampling.switchingFrequencyHz * design.sampling.updatesPerCarrier);
  const kv = (Math.SQRT2 * design.grid.voltageRmsV) / (2 * design.dcLink.capacitanceF * design.dcLink.voltageRefV);
  const k = (kv * ts * b.currentBaseA) / design.dcLink.voltageRefV;
  const frac = set.signalFracBits;
  const word = (x: number): number => (arithmetic === 'fixed'
    ? quantizeValue(x, { wordBits, fracBits: frac, signed: true }, 'nearest-away', 'saturate').code
    : Math.fround(x));
  const value = (u: number): number => (arithmetic === 'fixed' ? u / 2 ** frac : u);
  const text = arithmetic === 'fixed' ? String : bitsText;
  const state = createPiState(set.pi['voltage-pi']);
  const limit = set.limits.currentReference.word;
  const { settle, saturate, recover } = fixture.phases;
  const outs: string[] = [];
  const volts: number[] = [];
  let v = 1;
  for (let n = 0; n < settle + saturate + recover; n += 1) {
    const load = n < settle ? fixture.loadsPu[0] : n < settle + saturate ? fixture.loadsPu[1] : fixture.loadsPu[2];
    const u = stepPi(state, word(1 - v), limit, antiWindup);
    outs.push(text(u));
    v = v + k * (value(u) - load);
    volts.push(v);
  }
  const start = settle + saturate;
  let settled = start;
  for (let n = volts.length - 1; n >= start; n -= 1) {
    if (Math.abs(volts[n] - 1) > fixture.bandPu) { settled = n + 1; break; }
  }
  return { set, outs, volts, recovery: settled >= volts.length ? null : settled - start, limit: text(limit) };
}

describe('limited PI against the reference simulation (generate_antiwindup.py)', () => {
  it.each(fixture.runs.map((r) => [`${r.arithmetic === 'fixed' ? `fixed${r.wordBits}` : 'float32'} ${r.antiWindup}`, r] as const))('%s: same gains, same trace bit for bit, same recovery', (_label, ref) => {
    const run = simulate(ref.arithmetic, ref.wordBits as 16 | 32, ref.antiWindup);
    const taps = run.set.pi['voltage-pi'];
    if (taps.arithmetic === 'fixed') {
      expect({ kp: taps.kp, kpFracBits: taps.kpFracBits, ki: taps.ki, kiFracBits: taps.kiFracBits, guardBits: taps.guardBits }).toEqual(ref.taps);
    } else {
      expect({ kp: taps.kp, ki: taps.ki }).toEqual(ref.taps);
    }
    expect(run.limit).toBe(ref.limit);
    expect(run.outs.filter((_, i) => i % 250 === 0)).toEqual(ref.every250);
    expect(createHash('sha256').update(run.outs.join(',')).digest('hex')).toBe(ref.sha256);
    expect(run.recovery).toBe(ref.recoverySamples);
    expect(run.outs.slice(fixture.phases.settle, fixture.phases.settle + fixture.phases.saturate).filter((u) => u === run.limit).length).toBe(ref.saturatedSamples);
  });

  it.each([['fixed', 32], ['fixed', 16], ['float32', 32]] as const)('%s (W = %s): with anti-windup the link recovers in less than half the samples, with a tenth of the overshoot', (arithmetic, wordBits) => {
    const withAw = simulate(arithmetic, wordBits, 'conditional-integration');
    const without = simulate(arithmetic, wordBits, 'none');
    // both runs saturate for most of the overload (the clamp acts)
    const overload = withAw.outs.slice(fixture.phases.settle, fixture.phases.settle + fixture.phases.saturate);
    expect(overload.filter((u) => u === withAw.limit).length).toBeGreaterThan(100);
    expect(withAw.recovery).not.toBeNull();
    expect(without.recovery).not.toBeNull();
    expect(2 * withAw.recovery!).toBeLessThan(without.recovery!);
    const start = fixture.phases.settle + fixture.phases.saturate;
    const overshoot = (volts: number[]) => Math.max(...volts.slice(start)) - 1;
    expect(10 * overshoot(withAw.volts)).toBeLessThan(overshoot(without.volts));
  });
});

describe('PR limit and PLL clamp', () => {
  const sc3 = JSON.parse(readFileSync(new URL('../../examples/sc3-bench-l-120v.json', import.meta.url), 'utf8')) as DesignInput;

  it.each([['fixed32', { wordBits: 32 }], ['fixed16 robust', { wordBits: 16, structure: 'quantization-robust' }], ['float32', { wordBits: 32, arithmetic: 'float32' }]] as const)('%s: every PR section output stays within the clamp while saturated, and rings down afterwards', (_label, fixedPoint) => {
    const design: DesignInput = { ...sc3, fixedPoint: fixedPoint as DesignInput['fixedPoint'] };
    const set = firmwareSet(design, analyzeDesign(design, { sweepPoints: 0, responseSamples: 0 }));
    const pr = limitVectors(set, design, 1 / 20000, 2000).find((v) => v.blockId === 'current-pr')!;
    const limit = pr.limit!;
    expect(pr.expected.filter((y) => Math.abs(y) === limit).length).toBeGreaterThan(200);
    const block = set.blocks.find((b) => b.id === 'current-pr')!;
    // largest section state, in output units: the stored output (Direct Form I) or half the
    // accumulator bound 2 limit 2^G (delta form, s1 carries the output)
    const peakOf = (clamp: number | undefined) => {
      const state = createBlockState(block.sections);
      let peak = 0;
      const outs = pr.input.map((x) => {
        const y = stepBlock(state, x, clamp);
        for (const s of state.sections) {
          const held = 'arithmetic' in s ? (s.form === 'delta-operator' ? Math.abs(s.s1) / 2 : Math.abs(s.y1)) : 'form' in s ? Number(s.s1 < 0n ? -s.s1 : s.s1) / 2 ** (s.fixed.guardBits + 1) : Math.abs(s.y1);
          peak = Math.max(peak, held);
        }
        return y;
      });
      return { outs, peak };
    };
    const limited = peakOf(limit);
    expect(limited.outs).toEqual(pr.expected);
    expect(limited.peak).toBeLessThanOrEqual(limit);
    // without the limit the same excitation drives the resonator states well past it
    expect(peakOf(undefined).peak).toBeGreaterThan(1.5 * limit);
  });

  it('the PLL output never leaves its frequency clamp, and the integrator restarts at once when the error reverses', () => {
    const set = firmwareSet(sc3, analyzeDesign(sc3, { sweepPoints: 0, responseSamples: 0 }));
    const limit = set.limits.pllFrequency.word;
    const state = createPiState(set.pi['pll-pi']);
    const big = set.limits.pllFrequency.word * 4;
    const push = Array.from({ length: 2000 }, () => stepPi(state, big, limit));
    expect(Math.max(...push)).toBeLessThanOrEqual(limit);
    expect(push.at(-1)).toBe(limit);
    // reversed error: the output leaves the clamp on the very next sample (no wound-up integral to undo)
    const back = stepPi(state, -big, limit);
    expect(back).toBeLessThan(limit);
    resetPiState(state);
    const wound = createPiState(set.pi['pll-pi']);
    for (let i = 0; i < 2000; i += 1) stepPi(wound, big, limit, 'none');
    expect(stepPi(wound, -big, limit, 'none')).toBe(limit);
  });
});
