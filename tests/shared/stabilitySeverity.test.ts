// Stability severities of the analysis on a current loop whose margins are known in closed form:
// a proportional controller on a lossless L plant with ZOH and one sample of computation delay.
// L(z) = kp Ts / (L z (z - 1)); at the phase crossover fs/6, |z - 1| = 1, so GM = -20 log10(kp Ts / L)
// and the loop is stable only for kp < L/Ts (Buso & Mattavelli, Digital Control in Power Electronics, 2006).
// Severity limits GM 6 dB and Ms 2 (Skogestad & Postlethwaite, Multivariable Feedback Control, 2005).
import { describe, it, expect } from 'vitest';
import { readFileSync } from 'node:fs';
import { expectClose } from '../helpers/expectClose';
import { analyzeDesign } from '../../shared/control/analyze';
import type { DesignInput } from '../../shared/control/types';

const base = JSON.parse(readFileSync(new URL('../../examples/sc3-bench-l-120v.json', import.meta.url), 'utf8')) as DesignInput;
const inductanceH = 1e-3;
const switchingHz = 10_000;
const critical = inductanceH * switchingHz; // L / Ts = 10 Ohm

function withKp(kpOverL: number): DesignInput {
  return {
    ...base,
    filter: { topology: 'L', inductanceH, resistanceOhm: 0 },
    sampling: { switchingFrequencyHz: switchingHz, updatesPerCarrier: 1, computationDelaySamples: 1 },
    // A vanishing resonator leaves the proportional loop's margins as they are.
    currentLoop: { ...base.currentLoop, harmonics: [1], resonantBandwidthHz: 0.5, kp: kpOverL * critical, resonantGains: [1e-6] },
  };
}

const severityOf = (design: DesignInput, id: string) => analyzeDesign(design, { sweepPoints: 0, responseSamples: 0 }).checks.find((c) => c.id === id)?.severity;

describe('current-loop stability severities on the P + delay + L loop', () => {
  it.each([[0.3], [0.5], [0.8], [0.95]])('kp = %f L/Ts: GM = -20 log10(kp Ts/L) at fs/6, stable', (ratio) => {
    const result = analyzeDesign(withKp(ratio), { sweepPoints: 0, responseSamples: 0 });
    const loop = result.loops.find((l) => l.id === 'current');
    expect(loop?.stable).toBe(true);
    expectClose(loop?.gainMarginDb ?? NaN, -20 * Math.log10(ratio), { atol: 0.01 }, 'GM');
    const phaseCrossing = loop?.crossings?.find((c) => c.kind === 'phase-crossover');
    expect(phaseCrossing, JSON.stringify(loop?.crossings)).toBeDefined();
    expectClose(phaseCrossing?.frequencyHz ?? NaN, switchingHz / 6, { rtol: 1e-4 }, 'phase crossover');
    expect(loop?.maxPoleRadius ?? NaN).toBeLessThan(1);
  });

  it.each([[1.05], [1.5], [3]])('kp = %f L/Ts is unstable: an error check, poles outside the unit circle', (ratio) => {
    const design = withKp(ratio);
    const result = analyzeDesign(design, { sweepPoints: 0, responseSamples: 0 });
    const loop = result.loops.find((l) => l.id === 'current');
    expect(loop?.stable).toBe(false);
    expect(loop?.maxPoleRadius ?? NaN).toBeGreaterThan(1);
    expect(severityOf(design, 'loop-current-stability')).toBe('error');
  });

  // GM >= 6 dB means kp <= L/(2 Ts) (20 log10 2 = 6.02 dB).
  it.each([[0.45, 'info'], [0.6, 'warning']] as const)('kp = %f L/Ts gives a gain-margin check of severity %s', (ratio, severity) => {
    expect(severityOf(withKp(ratio), 'loop-current-gain-margin')).toBe(severity);
  });

  // Ms >= 1/(distance of L from -1) >= 1/(1 - kp Ts/L) at the phase crossover, above 2 for kp > L/(2 Ts).
  it('close to the stability limit the peak sensitivity exceeds 2 and is a warning', () => {
    const design = withKp(0.9);
    const loop = analyzeDesign(design, { sweepPoints: 0, responseSamples: 0 }).loops.find((l) => l.id === 'current');
    expect(loop?.peakSensitivity ?? NaN).toBeGreaterThanOrEqual(1 / (1 - 0.9) - 1e-6);
    expect(severityOf(design, 'loop-current-peak-sensitivity')).toBe('warning');
    expect(severityOf(design, 'loop-current-stability')).not.toBe('error');
  });
});
