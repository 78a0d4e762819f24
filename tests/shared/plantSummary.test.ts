// Plant summary values against independent references: brute-force PWM and capacitor-energy
// simulations, phasor algebra, a dense admittance sweep and continuous-time filter responses.
// Designs here are variations made up for the test, none of them is in examples/.
import { describe, it, expect } from 'vitest';
import { readFileSync } from 'node:fs';
import { expectClose } from '../helpers/expectClose';
import { plantChecks, stepSettlingTimeS } from '../../shared/control/plant';
import { lowPassPrewarped } from '../../shared/control/blocks';
import type { DesignInput } from '../../shared/control/types';

const base = JSON.parse(readFileSync(new URL('../../examples/sc3-bench-l-120v.json', import.meta.url), 'utf8')) as DesignInput;

interface Variant {
  label: string;
  voltageRmsV: number;
  frequencyHz: number;
  apparentPowerVA: number;
  filter: DesignInput['filter'];
  capacitanceF: number;
  voltageRefV: number;
  switchingFrequencyHz: number;
  updatesPerCarrier: 1 | 2;
  order: 1 | 2;
  cutoffHz: number;
}

const variants: Variant[] = [
  { label: 'L 2.2 kVA 110 V 60 Hz', voltageRmsV: 110, frequencyHz: 60, apparentPowerVA: 2200, filter: { topology: 'L', inductanceH: 0.9e-3, resistanceOhm: 0.05 }, capacitanceF: 1.5e-3, voltageRefV: 190, switchingFrequencyHz: 18000, updatesPerCarrier: 1, order: 1, cutoffHz: 8 },
  { label: 'L 4 kVA 230 V 50 Hz', voltageRmsV: 230, frequencyHz: 50, apparentPowerVA: 4000, filter: { topology: 'L', inductanceH: 4.2e-3, resistanceOhm: 0.12 }, capacitanceF: 1.1e-3, voltageRefV: 380, switchingFrequencyHz: 12000, updatesPerCarrier: 2, order: 2, cutoffHz: 12 },
  { label: 'LCL 6 kVA 240 V 60 Hz', voltageRmsV: 240, frequencyHz: 60, apparentPowerVA: 6000, filter: { topology: 'LCL', inverterInductanceH: 1.6e-3, gridInductanceH: 0.7e-3, capacitanceF: 6.8e-6, dampingResistanceOhm: 1.5, resistanceOhm: 0.04 }, capacitanceF: 2.7e-3, voltageRefV: 400, switchingFrequencyHz: 15000, updatesPerCarrier: 2, order: 2, cutoffHz: 6 },
];

function designOf(v: Variant): DesignInput {
  return {
    ...base,
    grid: { voltageRmsV: v.voltageRmsV, frequencyHz: v.frequencyHz },
    rating: { apparentPowerVA: v.apparentPowerVA },
    filter: v.filter,
    dcLink: { capacitanceF: v.capacitanceF, voltageRefV: v.voltageRefV },
    sampling: { ...base.sampling, switchingFrequencyHz: v.switchingFrequencyHz, updatesPerCarrier: v.updatesPerCarrier },
    reactiveFilter: { order: v.order, cutoffHz: v.cutoffHz },
  };
}

function summaryOf(v: Variant) {
  const ts = 1 / (v.switchingFrequencyHz * v.updatesPerCarrier);
  const lpf = lowPassPrewarped(v.order, 2 * Math.PI * v.cutoffHz, ts);
  return plantChecks(designOf(v), lpf, ts);
}

function inverterInductanceH(filter: DesignInput['filter']): number {
  return filter.topology === 'L' ? filter.inductanceH : filter.inverterInductanceH;
}
function totalInductanceH(filter: DesignInput['filter']): number {
  return filter.topology === 'L' ? filter.inductanceH : filter.inverterInductanceH + filter.gridInductanceH;
}

/**
 * Peak-to-peak inductor current ripple of naturally sampled unipolar PWM over one carrier period,
 * by stepping the two leg comparisons on a fine time grid (the grid voltage cancels the average).
 */
function simulatedUnipolarRipplePp(vdc: number, l: number, fsw: number, modulation: number): number {
  const steps = 40_000;
  const dt = 1 / fsw / steps;
  let i = 0, lo = 0, hi = 0;
  for (let k = 0; k < steps; k++) {
    const phase = (k + 0.5) / steps; // triangle carrier in [-1, 1]
    const carrier = phase < 0.5 ? -1 + 4 * phase : 3 - 4 * phase;
    const legA = modulation > carrier ? 1 : 0;
    const legB = -modulation > carrier ? 1 : 0;
    i += ((vdc * (legA - legB) - vdc * modulation) / l) * dt;
    lo = Math.min(lo, i);
    hi = Math.max(hi, i);
  }
  return hi - lo;
}

describe('plant summary', () => {
  it.each(variants)('$label: rated current S/V and drop w0 L I / V', (v) => {
    const { summary } = summaryOf(v);
    const i = v.apparentPowerVA / v.voltageRmsV;
    expectClose(summary.ratedCurrentA, i, { rtol: 1e-15 }, 'I');
    expectClose(summary.ratedPeakCurrentA, Math.SQRT2 * i, { rtol: 1e-15 }, 'Ipk');
    expectClose(summary.inductorDropFraction, (2 * Math.PI * v.frequencyHz * totalInductanceH(v.filter) * i) / v.voltageRmsV, { rtol: 1e-12 }, 'drop');
  });

  // 5 % drop rule (common practice, no source): the 0.58 mH inductor of 3.3 kVA, 120 V, 60 Hz drops about 5 %.
  it('the 5 % rule inductance reads back as about 5 % drop', () => {
    const v: Variant = { ...variants[0], voltageRmsV: 120, frequencyHz: 60, apparentPowerVA: 3300, filter: { topology: 'L', inductanceH: 0.58e-3, resistanceOhm: 0.03 } };
    expectClose(summaryOf(v).summary.inductorDropFraction, 0.05, { atol: 0.0005 }, 'drop');
  });

  // Worst-case ripple of unipolar PWM over all modulation depths, by brute-force simulation
  // (compared with the closed form Vdc/(8 L fsw) the summary uses; Holmes & Lipo 2003, from memory).
  it.each(variants)('$label: switching ripple equals the worst simulated unipolar PWM ripple', (v) => {
    const { summary } = summaryOf(v);
    const l = inverterInductanceH(v.filter);
    let worst = 0;
    for (let m = 0.02; m < 1; m += 0.02) worst = Math.max(worst, simulatedUnipolarRipplePp(v.voltageRefV, l, v.switchingFrequencyHz, m));
    expectClose(summary.rippleCurrentPeakToPeakA, worst, { rtol: 2e-3 }, 'ripple');
    expectClose(summary.rippleFractionOfPeak, summary.rippleCurrentPeakToPeakA / summary.ratedPeakCurrentA, { rtol: 1e-12 }, 'fraction');
  });

  // Exact capacitor energy balance (common practice, no source): 1/2 C d(v^2)/dt = -S cos(2 w0 t), so
  // v^2 = Vdc^2 - S sin(2 w0 t) / (w0 C); the linearised peak-to-peak S / (w0 C Vdc) differs at second order.
  it.each(variants)('$label: DC-link 2w ripple matches the exact energy balance', (v) => {
    const { summary } = summaryOf(v);
    const e = v.apparentPowerVA / (2 * Math.PI * v.frequencyHz * v.capacitanceF);
    const exactPp = Math.sqrt(v.voltageRefV ** 2 + e) - Math.sqrt(v.voltageRefV ** 2 - e);
    const eps = e / v.voltageRefV ** 2;
    expectClose(summary.dcLinkRipplePeakToPeakV, exactPp, { rtol: eps * eps }, 'ripple');
  });

  // Phasor algebra (common practice, no source): the inverter voltage V + j w0 L I e^{j phi} is largest over
  // all power factors at |I| = rated, and the modulator needs its peak on the DC link.
  it.each(variants)('$label: minimum DC-link voltage is the worst inverter-voltage peak over power factor', (v) => {
    const { summary } = summaryOf(v);
    const x = 2 * Math.PI * v.frequencyHz * totalInductanceH(v.filter) * (v.apparentPowerVA / v.voltageRmsV);
    let worst = 0;
    for (let k = 0; k <= 3600; k++) {
      const phi = (2 * Math.PI * k) / 3600;
      worst = Math.max(worst, Math.hypot(v.voltageRmsV - x * Math.sin(phi), x * Math.cos(phi)));
    }
    expectClose(summary.minimumDcLinkVoltageV, Math.SQRT2 * worst, { rtol: 1e-9 }, 'Vdc,min');
    const ripplePeak = summary.dcLinkRipplePeakToPeakV / 2;
    expectClose(summary.dcLinkHeadroomV, v.voltageRefV - ripplePeak - summary.minimumDcLinkVoltageV, { rtol: 1e-12 }, 'headroom');
  });

  it('an L filter has no LCL resonance; a too-low DC link is an error check', () => {
    const { summary, checks } = summaryOf({ ...variants[0], voltageRefV: 150 });
    expect(summary.lclResonanceHz).toBeNull();
    expect(summary.lclCapacitorReactiveFraction).toBeNull();
    expect(checks.find((c) => c.id === 'plant-dc-link-headroom')?.severity).toBe('error');
    expect(checks.find((c) => c.id === 'plant-lcl-resonance')).toBeUndefined();
  });

  // LCL inverter-side admittance Y = 1/(L1 s + L2 s Zc/(L2 s + Zc)), Zc = 1/(Cf s), undamped: its peak on a
  // dense frequency sweep is the resonance (Liserre, Blaabjerg & Hansen, IEEE TIA 41(5), 2005).
  it('LCL resonance is the peak of the undamped inverter-side admittance', () => {
    const v = variants[2];
    if (v.filter.topology !== 'LCL') throw new Error('variant 2 is LCL');
    const { inverterInductanceH: l1, gridInductanceH: l2, capacitanceF: cf } = v.filter;
    const { summary } = summaryOf(v);
    let bestHz = 0, best = 0;
    for (let f = 100; f < 20_000; f += 0.05) {
      const w = 2 * Math.PI * f;
      // s = jw: L2 s Zc / (L2 s + Zc) = j w L2 / (1 - w^2 L2 Cf), purely imaginary.
      const im = w * l1 + (w * l2) / (1 - w * w * l2 * cf);
      const mag = 1 / Math.abs(im);
      if (mag > best) { best = mag; bestHz = f; }
    }
    expect(summary.lclResonanceHz).not.toBeNull();
    expectClose(summary.lclResonanceHz ?? NaN, bestHz, { atol: 0.05 }, 'fres');
    expectClose(summary.lclCapacitorReactiveFraction ?? NaN, (2 * Math.PI * v.frequencyHz * cf * v.voltageRmsV ** 2) / v.apparentPowerVA, { rtol: 1e-12 }, 'Qc');
  });

  // Continuous Butterworth magnitude |H(jw)| = 1/sqrt(1 + (w/wc)^(2n)) (Oppenheim & Schafer, Discrete-Time
  // Signal Processing, 2010); the prewarped bilinear filter sits within 0.02 dB of it at 2 f0 << fs.
  it.each(variants)('$label: estimator attenuation at 2 f0 follows the Butterworth magnitude', (v) => {
    const { summary } = summaryOf(v);
    const ratio = (2 * v.frequencyHz) / v.cutoffHz;
    expectClose(summary.estimatorAttenuationDb, 10 * Math.log10(1 + ratio ** (2 * v.order)), { atol: 0.02 }, 'dB');
  });

  // 2 % settling of the continuous step response: first order ln(50)/wc; second-order Butterworth from the
  // closed-form step response 1 - e^{-z wn t}(cos wd t + z/sqrt(1-z^2) sin wd t) (Ogata, Modern Control
  // Engineering, 2010), scanned densely. The sampled filter agrees within a few samples.
  it.each(variants)('$label: estimator 2 % settling time matches the continuous step response', (v) => {
    const { summary } = summaryOf(v);
    const wc = 2 * Math.PI * v.cutoffHz;
    let expected: number;
    if (v.order === 1) expected = Math.log(50) / wc;
    else {
      const z = Math.SQRT1_2, wd = wc * Math.sqrt(1 - z * z);
      expected = 0;
      for (let t = 0; t < 20 / wc; t += 1e-6) {
        const y = 1 - Math.exp(-z * wc * t) * (Math.cos(wd * t) + (z / Math.sqrt(1 - z * z)) * Math.sin(wd * t));
        if (Math.abs(y - 1) > 0.02) expected = t;
      }
    }
    const ts = 1 / (v.switchingFrequencyHz * v.updatesPerCarrier);
    expect(summary.estimatorSettlingTimeS).not.toBeNull();
    expectClose(summary.estimatorSettlingTimeS ?? NaN, expected, { atol: 3 * ts + 0.002 * expected }, 'settling');
  });

  // y[n] = 1 - 0.5^(n+1) for b = [0.5], a = [1, -0.5]: outside 2 % up to n = 4 (exact arithmetic, no source needed).
  it('stepSettlingTimeS on a geometric step and on an unsettled integrator', () => {
    expectClose(stepSettlingTimeS({ b: [0.5, 0, 0], a: [1, -0.5, 0] }, 1, 100) ?? NaN, 5, { atol: 0 }, 'n');
    expect(stepSettlingTimeS({ b: [0.001, 0, 0], a: [1, -0.999, 0] }, 1, 100)).toBeNull();
  });
});
