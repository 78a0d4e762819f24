// Filter sizing against the published closed forms: the 5 % inductor-drop rule (common practice),
// the LCL rules of Liserre, Blaabjerg & Hansen, "Design and control of an LCL-filter-based
// three-phase active rectifier", IEEE TIA 41(5), 2005 (capacitor reactive power <= 5 %, resonance
// between 10 x grid frequency and half the sampling rate, Rd a third of the capacitor impedance at
// resonance), and the DC-link ripple of Kjaer, Pedersen & Blaabjerg, IEEE TIA 41(5), 2005.
import { describe, expect, it } from 'vitest';
import {
  baseImpedanceOhm, capacitanceForReactiveFractionF, ControlError, dcLinkCapacitanceForRippleF, inductanceForDropH,
  lclResonanceHz, startingLcl,
} from '../../shared/control';
import { expectClose } from '../helpers/expectClose';

const unit120 = { voltageRmsV: 120, frequencyHz: 60, apparentPowerVA: 3300 };
const unit240 = { voltageRmsV: 240, frequencyHz: 60, apparentPowerVA: 5000 };
const unit230 = { voltageRmsV: 230, frequencyHz: 50, apparentPowerVA: 4000 };

describe('base impedance and the drop rule', () => {
  it('Zb = V^2 / S (hand-derived: 240^2 / 5000 = 11.52 ohm)', () => {
    expectClose(baseImpedanceOhm(unit240), 11.52, { rtol: 1e-15 });
  });

  it('L = x V^2 / (w0 S): 5 % of 120 V at 3.3 kVA, 60 Hz is 0.05 * 14400 / (2 pi 60 * 3300) H', () => {
    expectClose(inductanceForDropH(unit120, 0.05), (0.05 * 14400) / (2 * Math.PI * 60 * 3300), { rtol: 1e-15 });
    expectClose(inductanceForDropH(unit120, 0.05), 5.7875e-4, { rtol: 1e-4 });
  });

  it.each([unit120, unit240, unit230])('the drop w0 L I / V at rated current is the asked fraction (%o)', (r) => {
    for (const x of [0.02, 0.05, 0.1]) {
      const l = inductanceForDropH(r, x);
      const ratedCurrentA = r.apparentPowerVA / r.voltageRmsV;
      expectClose((2 * Math.PI * r.frequencyHz * l * ratedCurrentA) / r.voltageRmsV, x, { rtol: 1e-12 });
    }
  });
});

describe('LCL rules (Liserre, Blaabjerg & Hansen 2005)', () => {
  it('Cf draws the asked fraction of the rating: w0 Cf V^2 / S = x', () => {
    for (const r of [unit120, unit240, unit230]) {
      const cf = capacitanceForReactiveFractionF(r, 0.05);
      expectClose((2 * Math.PI * r.frequencyHz * cf * r.voltageRmsV ** 2) / r.apparentPowerVA, 0.05, { rtol: 1e-12 });
    }
  });

  it('resonance sqrt((L1 + L2)/(L1 L2 Cf)) / (2 pi) equals 1 / (2 pi sqrt(Lpar Cf)) with L1 || L2', () => {
    const [l1, l2, cf] = [1e-3, 0.5e-3, 8.2e-6];
    const parallel = (l1 * l2) / (l1 + l2);
    expectClose(lclResonanceHz(l1, l2, cf), 1 / (2 * Math.PI * Math.sqrt(parallel * cf)), { rtol: 1e-12 });
    expectClose(lclResonanceHz(l1, l2, cf), 3044.5, { rtol: 1e-4 });
  });

  it('places the resonance at the geometric mean of (10 f0, fs/2) with the larger inductor on the inverter side', () => {
    const lcl = startingLcl(unit240, 32000)!;
    expectClose(lcl.resonanceHz, Math.sqrt(600 * 16000), { rtol: 1e-9 });
    expectClose(lclResonanceHz(lcl.inverterInductanceH, lcl.gridInductanceH, lcl.capacitanceF), lcl.resonanceHz, { rtol: 1e-12 });
    expect(lcl.inverterInductanceH).toBeGreaterThanOrEqual(lcl.gridInductanceH);
    expectClose(lcl.inverterInductanceH + lcl.gridInductanceH, inductanceForDropH(unit240, 0.05), { rtol: 1e-12 });
    expectClose(lcl.capacitanceF, capacitanceForReactiveFractionF(unit240, 0.05), { rtol: 1e-12 });
    expect(lcl.resonanceWindowHz).toEqual([600, 16000]);
    // Rd = Z_Cf(w_res) / 3.
    expectClose(lcl.dampingResistanceOhm, 1 / (3 * 2 * Math.PI * lcl.resonanceHz * lcl.capacitanceF), { rtol: 1e-12 });
  });

  it('keeps the equal split when even it resonates above the target: f_res = 1/(pi sqrt(Lt Cf)) = 40 f0 at 5 % and 5 %', () => {
    // Lt Cf = (x / w0)^2 with x = 0.05 for both rules, so the lowest resonance is w0 / (pi x) = 40 f0 (hand-derived).
    const lcl = startingLcl(unit120, 16000)!;
    expectClose(lcl.inverterInductanceH, lcl.gridInductanceH, { rtol: 1e-12 });
    expectClose(lcl.resonanceHz, 40 * 60, { rtol: 1e-9 });
  });

  it('gives null when no split lands below half the sampling rate (fs <= 80 f0)', () => {
    expect(startingLcl(unit120, 4000)).toBeNull();
    expect(startingLcl(unit230, 5000)).not.toBeNull();
  });

  it('refuses meaningless inputs with a ControlError', () => {
    expect(() => inductanceForDropH({ ...unit120, apparentPowerVA: 0 }, 0.05)).toThrow(ControlError);
    expect(() => inductanceForDropH(unit120, 1.5)).toThrow(ControlError);
    expect(() => startingLcl(unit120, 1000)).toThrow(ControlError);
  });
});

describe('DC-link capacitance for a ripple (Kjaer, Pedersen & Blaabjerg 2005)', () => {
  it('C = S / (2 w0 Vdc dV): 3.3 kVA, 60 Hz, 200 V, 10 V peak', () => {
    expectClose(dcLinkCapacitanceForRippleF(unit120, 200, 10), 3300 / (2 * 2 * Math.PI * 60 * 200 * 10), { rtol: 1e-15 });
    expectClose(dcLinkCapacitanceForRippleF(unit120, 200, 10), 2.1884e-3, { rtol: 1e-4 });
  });

  it('stores the 2 w0 energy swing: S / (2 w0) = C Vdc dV (capacitor energy C (V+dV)^2/2 - C (V-dV)^2/2 over 2)', () => {
    const c = dcLinkCapacitanceForRippleF(unit230, 380, 12);
    const swingJ = (c * ((380 + 12) ** 2 - (380 - 12) ** 2)) / 2;
    expectClose(swingJ / 2, 4000 / (2 * 2 * Math.PI * 50), { rtol: 1e-12 });
  });
});
