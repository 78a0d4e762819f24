// Physics of the plant and of the metrics, against closed forms and facts of the trade.
import { describe, expect, it } from 'vitest';
import {
  branchPower, defaultSimulationOptions, fourierCoefficients, gridInductanceForScr, seriesLoadForPower, simulateScenario, thdPercent,
  type SampledController,
} from '../../../shared/simulation';
import { expectClose } from '../../helpers/expectClose';
import { analysisOf, demoDesign, runPlant } from './helpers';

const sc3 = demoDesign('sc3-bench-l-120v.json');
const sc5 = demoDesign('sc5-field-lcl-240v.json');
const sc3Analysis = analysisOf(sc3);
const sc5Analysis = analysisOf(sc5);

describe('energy balance: grid power = load power + converter losses + change of stored energy', () => {
  // The trapezoidal rule keeps the energy of the lossless parts exactly for a linear circuit (it is
  // the implicit midpoint rule there); what remains is the quadrature of the recorded products,
  // second order in the step. Bound: 0.1 % of the load power.
  it.each([
    ['SC-3, SCR 5, averaged', sc3, 'averaged'],
    ['SC-3, SCR 5, switched', sc3, 'switched'],
    ['SC-5 (LCL), SCR 5, switched', sc5, 'switched'],
  ] as const)('%s', (_name, design, model) => {
    const analysis = design === sc3 ? sc3Analysis : sc5Analysis;
    const r = simulateScenario(design, analysis, { ...defaultSimulationOptions('steady'), model, shortCircuitRatio: 5, durationS: 10 / design.grid.frequencyHz });
    const e = r.metrics.energyBalance;
    expect(e.converterLossW).toBeGreaterThan(0);
    expect(Math.abs(e.residualW), JSON.stringify(e)).toBeLessThan(1e-3 * e.loadActivePowerW);
    // The load draws what its phasors say at the PCC voltage it sees (0.8 S at nominal voltage).
    const nominal = branchPower(seriesLoadForPower(design.grid.voltageRmsV, design.grid.frequencyHz, design.rating.apparentPowerVA, 0.8, 'lagging'), r.metrics.pccVoltageFundamentalRmsV, design.grid.frequencyHz);
    expectClose(e.loadActivePowerW, nominal.activePowerW, { rtol: 2e-3 }, 'load power at the simulated PCC voltage');
  });
});

describe('steady state of an R-L load behind a weak grid matches its phasor solution', () => {
  // Bridge held at zero voltage (both legs at half the carrier): the filter R + jwL and the load
  // R_l + jwL_l in parallel behind jwL_g: I_g = V_s / (jwL_g + Z_l || Z_f), I_l = I_g Z_f / (Z_l + Z_f)
  // (Nilsson & Riedel, "Electric Circuits", phasor circuit analysis, from memory). The trapezoidal
  // rule's steady state is the circuit's at s = j (2/h) tan(w h / 2) (the bilinear map: a frequency
  // error of (w h)^2 / 12) with the forcing averaged over each step (a factor cos(w h / 2), about
  // 1 - (w h)^2 / 8): we allow (w h)^2 of the current.
  it('SC-3 at SCR 5: grid and load current fundamentals within (w h)^2 of the phasor solution', () => {
    const counts = 2500;
    const idle: SampledController = { reset: () => {}, step: () => ({ compareA: counts / 2, compareB: counts / 2, log: {} }) };
    const load = seriesLoadForPower(120, 60, 3300, 0.8, 'lagging');
    // 1.2 s: the DC current the switch-on leaves circulating through L_g and the filter decays with
    // (L_g + L) / R = 97 ms, to e^-12 of its start.
    const record = runPlant({ design: sc3, controller: idle, loads: [load], shortCircuitRatio: 5, samples: 24000 });
    const w = 2 * Math.PI * 60;
    const lg = gridInductanceForScr(sc3, 5);
    expectClose(lg, (120 * 120) / (5 * 3300 * w), { rtol: 1e-15 }, 'L_g = V^2 / (SCR S w) (CONTRACT section 9)');
    const f = sc3.filter.topology === 'L' ? sc3.filter : null;
    if (!f || load.kind !== 'series-rl') throw new Error('SC-3 has an L filter');
    const c = (re: number, im: number) => ({ re, im });
    const mul = (a: { re: number; im: number }, b: { re: number; im: number }) => c(a.re * b.re - a.im * b.im, a.re * b.im + a.im * b.re);
    const div = (a: { re: number; im: number }, b: { re: number; im: number }) => { const m = b.re * b.re + b.im * b.im; return c((a.re * b.re + a.im * b.im) / m, (a.im * b.re - a.re * b.im) / m); };
    const add = (a: { re: number; im: number }, b: { re: number; im: number }) => c(a.re + b.re, a.im + b.im);
    const zl = c(load.resistanceOhm, w * load.inductanceH);
    const zf = c(f.resistanceOhm, w * f.inductanceH);
    const parallel = div(mul(zl, zf), add(zl, zf));
    const vs = c(0, -Math.SQRT2 * 120); // sqrt(2) 120 sin(wt) = Re(-j sqrt(2) 120 e^{jwt})
    const ig = div(vs, add(c(0, w * lg), parallel));
    const il = div(mul(ig, zf), add(zl, zf));
    const t1 = record.window.timeS[record.window.count - 1];
    const gridC = fourierCoefficients(record.window, record.window.columns.gridCurrentA, 60, 1, t1 - 5 / 60, t1);
    const loadC = fourierCoefficients(record.window, record.window.columns.loadCurrentA, 60, 1, t1 - 5 / 60, t1);
    const scale = Math.hypot(ig.re, ig.im);
    const wh = (w * record.samplePeriodS) / record.substepsPerSample;
    expect(wh * wh).toBeLessThan(1e-3);
    expectClose([gridC.re[1], gridC.im[1]], [ig.re, ig.im], { atol: wh * wh * scale }, 'grid current phasor');
    expectClose([loadC.re[1], loadC.im[1]], [il.re, il.im], { atol: wh * wh * scale }, 'load current phasor');
  });
});

describe('THD as IEEE Std 519-2014 defines it (rms of orders 2..50 over the fundamental)', () => {
  it('by hand: sqrt(0.3^2 + 0.4^2) / 10 = 5 %', () => {
    expectClose(thdPercent([0, 10, 0, 0.3, 0, 0.4]) ?? NaN, 5, { rtol: 1e-15 }, 'THD');
    expect(thdPercent([0, 0, 1])).toBeNull();
  });

  it('of a triangle wave (piecewise linear, so the Fourier integrals are exact): 100 sqrt(sum_{h odd 3..49} h^-4)', () => {
    // Triangle of peak 1: b_h = 8 / (pi^2 h^2) (-1)^((h-1)/2) for odd h (Fourier series of a triangle wave).
    const f = 50;
    const cycles = 5;
    const t: number[] = [];
    const y: number[] = [];
    for (let k = 0; k <= 4 * cycles; k++) { t.push(k / (4 * f)); y.push([0, 1, 0, -1][k % 4]); }
    const c = fourierCoefficients({ timeS: t, count: t.length }, y, f, 60, 0, cycles / f);
    const amplitudes = Array.from({ length: 61 }, (_, h) => Math.hypot(c.re[h], c.im[h]));
    for (const h of [1, 3, 5, 7, 49]) expectClose(amplitudes[h], 8 / (Math.PI * Math.PI * h * h), { rtol: 1e-12, atol: 1e-15 }, `|c_${h}|`);
    for (const h of [2, 4, 50]) expectClose(amplitudes[h], 0, { atol: 1e-14 }, `|c_${h}|`);
    let sum = 0;
    for (let h = 3; h <= 49; h += 2) sum += h ** -4;
    // The 51st and higher orders (present in a triangle) are outside the definition.
    expectClose(thdPercent(amplitudes) ?? NaN, 100 * Math.sqrt(sum), { rtol: 1e-11 }, 'THD of the triangle');
  });
});

describe('switched and averaged bridge agree on fundamental values', () => {
  // Unipolar PWM ripple, worst case peak to peak: dI = V_dc / (8 L f_sw) (REFERENCES: facts). The
  // averaged model is the switched one's mean over each update interval, and the samples are taken
  // where the current equals that mean; what the fundamental can differ by is second order: the
  // ripple times the fundamental's phase advance over half a carrier period, dI w0 / (2 f_sw). We
  // allow twice that. The peak current may differ by at most half the ripple.
  it.each([['SC-3 (L)', sc3], ['SC-5 (LCL, double update)', sc5]] as const)('%s steady', (_name, design) => {
    const analysis = design === sc3 ? sc3Analysis : sc5Analysis;
    const run = (model: 'averaged' | 'switched') => simulateScenario(design, analysis, { ...defaultSimulationOptions('steady'), model, durationS: 10 / design.grid.frequencyHz });
    const av = run('averaged');
    const sw = run('switched');
    const l = design.filter.topology === 'L' ? design.filter.inductanceH : design.filter.inverterInductanceH;
    const fsw = design.sampling.switchingFrequencyHz;
    const ripple = design.dcLink.voltageRefV / (8 * l * fsw);
    const bound = 2 * ripple * (2 * Math.PI * design.grid.frequencyHz) / (2 * fsw);
    // Fundamental phasor of the grid current from P and Q at the (stiff) PCC voltage.
    const dp = sw.metrics.gridActivePowerW - av.metrics.gridActivePowerW;
    const dq = sw.metrics.gridReactivePowerVar - av.metrics.gridReactivePowerVar;
    const gridPhasorDiffA = (Math.SQRT2 * Math.hypot(dp, dq)) / av.metrics.pccVoltageRmsV;
    expect(gridPhasorDiffA, `grid-current fundamental differs by ${gridPhasorDiffA} A (bound ${bound} A)`).toBeLessThan(bound);
    const unitDq = sw.metrics.unitReactivePowerVar - av.metrics.unitReactivePowerVar;
    expect((Math.SQRT2 * Math.abs(unitDq)) / av.metrics.pccVoltageRmsV).toBeLessThan(bound);
    expectClose(sw.metrics.dcLinkMeanV, av.metrics.dcLinkMeanV, { atol: 1e-4 * design.dcLink.voltageRefV }, 'DC-link mean');
    expect(Math.abs(sw.metrics.peakInverterCurrentA - av.metrics.peakInverterCurrentA)).toBeLessThanOrEqual(ripple / 2);
    expect(sw.metrics.peakInverterCurrentA).toBeGreaterThan(av.metrics.peakInverterCurrentA); // the switched model carries the ripple
  });
});

describe('harmonics from the grid and from the load', () => {
  // The load draws V5 / |Z_load(5 w)|; the inverter, which feeds the grid voltage forward, keeps only
  // what the finite gain of the damped h5 resonator leaves: allow 10 %.
  it('a 3 % fifth harmonic in the source reaches the grid current as the load draws it', () => {
    const r = simulateScenario(sc3, sc3Analysis, {
      ...defaultSimulationOptions('steady'), durationS: 10 / 60, backgroundHarmonics: [{ harmonic: 5, fraction: 0.03, phaseDeg: 0 }],
    });
    const load = seriesLoadForPower(120, 60, 3300, 0.8, 'lagging');
    if (load.kind !== 'series-rl') throw new Error();
    const i5 = (0.03 * Math.SQRT2 * 120) / Math.hypot(load.resistanceOhm, 5 * 2 * Math.PI * 60 * load.inductanceH);
    const grid1 = Math.SQRT2 * r.metrics.gridCurrentFundamentalRmsA;
    expectClose((r.metrics.gridCurrentHarmonicsPercent['5'] / 100) * grid1, i5, { rtol: 0.1 }, 'grid 5th harmonic = V5 / |Z_load(5w)|');
  });

  it('a capacitor-input rectifier draws a large third harmonic the unit does not compensate', () => {
    // Facts of the trade (common practice, no source): a capacitor-input diode rectifier's current
    // is peaky, its third harmonic of the order of its fundamental.
    const base = simulateScenario(sc3, sc3Analysis, { ...defaultSimulationOptions('steady'), durationS: 10 / 60 });
    const withRect = simulateScenario(sc3, sc3Analysis, { ...defaultSimulationOptions('steady'), durationS: 10 / 60, rectifierPowerW: 600 });
    const third = (r: typeof base) => (r.metrics.gridCurrentHarmonicsPercent['3'] / 100) * Math.SQRT2 * r.metrics.gridCurrentFundamentalRmsA;
    const rectifierFundamentalA = (Math.SQRT2 * 600) / 120;
    expect(third(withRect) - third(base)).toBeGreaterThan(0.5 * rectifierFundamentalA);
    expect(withRect.metrics.gridCurrentThdPercent ?? 0).toBeGreaterThan(base.metrics.gridCurrentThdPercent ?? 0);
    expectClose(withRect.metrics.energyBalance.residualW, 0, { atol: 2e-3 * withRect.metrics.loadActivePowerW }, 'energy balance with the rectifier');
  });
});
