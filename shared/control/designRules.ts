/**
 * Design rules: gains from targets (CONTRACT section 2). Each rule is used only when the design
 * file leaves the gain `null`; a number in the file overrides it.
 */
import type { DesignInput } from './types';

/** Where a gain came from. */
export type GainSource = 'rule' | 'override';

/** Gains of all blocks, SI (current loop in V/A, voltage loop in A/V and A/(V s), PLL per unit). */
export interface DesignedGains {
  currentKp: number;
  resonantGains: number[];
  voltageKp: number;
  voltageKi: number;
  /** Plant gain of the DC-link loop Kv, V/(A s): dVdc/dt = Kv * (active current amplitude). */
  voltagePlantGain: number;
  pllKp: number;
  pllKi: number;
  /** PLL natural frequency, rad/s. */
  pllNaturalRadPerS: number;
  sources: Record<string, GainSource>;
}

/** Fraction of kp that all resonators together may add at the current-loop crossover (our rule, see `defaultResonantGain`). */
export const RESONATOR_BUDGET_AT_CROSSOVER = 0.1;

/**
 * Total filter inductance seen by the current loop at low frequency.
 *
 * @param filter - the design's filter section.
 * @returns L in H (L filter) or L1 + L2 in H (LCL).
 * @example
 * totalInductanceH({ topology: 'L', inductanceH: 6e-4, resistanceOhm: 0.03 }); // => 0.0006
 */
export function totalInductanceH(filter: DesignInput['filter']): number {
  return filter.topology === 'L' ? filter.inductanceH : filter.inverterInductanceH + filter.gridInductanceH;
}

/**
 * DC-link plant gain from the averaged power balance.
 *
 * Method: C*Vdc*dVdc/dt = (Vpeak * Ipeak)/2 for an active current amplitude Ipeak, so
 * Kv = sqrt(2)*Vrms / (2*C*Vdc) (CONTRACT section 2; Kjaer, Pedersen & Blaabjerg, IEEE TIA 41(5), 2005).
 *
 * @param voltageRmsV - grid voltage, V rms.
 * @param capacitanceF - DC-link capacitance, F.
 * @param voltageRefV - DC-link voltage reference, V.
 * @returns Kv in V/(A s).
 * @example
 * voltagePlantGain(120, 0.0022, 200); // => 192.8...
 */
export function voltagePlantGain(voltageRmsV: number, capacitanceF: number, voltageRefV: number): number {
  return (Math.SQRT2 * voltageRmsV) / (2 * capacitanceF * voltageRefV);
}

/**
 * PI gains for a plant Kv/s from crossover and phase margin (symmetric placement at crossover).
 *
 * Method: |L(j wc)| = 1 and arg L(j wc) = -180 deg + pm give kp = wc*sin(pm)/Kv, ki = kp*wc/tan(pm)
 * (CONTRACT section 2; Buso & Mattavelli, "Digital Control in Power Electronics", 2006).
 *
 * @param crossoverRadPerS - crossover wc, rad/s (> 0).
 * @param phaseMarginRad - phase margin pm, rad, in (0, pi/2).
 * @param plantGain - Kv, plant gain per second.
 * @returns `{ kp, ki }` (ki per second).
 * @example
 * piForIntegratorPlant(2 * Math.PI * 12, Math.PI / 3, 192.8); // => { kp: 0.3387..., ki: 14.74... }
 */
export function piForIntegratorPlant(crossoverRadPerS: number, phaseMarginRad: number, plantGain: number): { kp: number; ki: number } {
  const kp = (crossoverRadPerS * Math.sin(phaseMarginRad)) / plantGain;
  return { kp, ki: (kp * crossoverRadPerS) / Math.tan(phaseMarginRad) };
}

/**
 * PLL loop-filter PI from settling time and damping.
 *
 * Method: second-order loop with wn = 4.6/(zeta*ts) (2 % settling), kp = 2*zeta*wn, ki = wn^2
 * (CONTRACT section 2; Ciobotaru, Teodorescu & Blaabjerg, PESC 2006; Golestan et al., IEEE TPEL 2017).
 *
 * @param settlingTimeS - 2 % settling time, s.
 * @param dampingRatio - zeta (dimensionless).
 * @returns `{ kp, ki, naturalRadPerS }` (kp in rad/s per unit error, ki in rad/s^2 per unit).
 * @example
 * pllPi(0.06, 0.7071); // => { kp: 153.3..., ki: 11752..., naturalRadPerS: 108.4... }
 */
export function pllPi(settlingTimeS: number, dampingRatio: number): { kp: number; ki: number; naturalRadPerS: number } {
  const naturalRadPerS = 4.6 / (dampingRatio * settlingTimeS);
  return { kp: 2 * dampingRatio * naturalRadPerS, ki: naturalRadPerS * naturalRadPerS, naturalRadPerS };
}

/**
 * Default resonant gain of harmonic h (Varsmith's documented rule).
 *
 * Rule: the resonators together may add at most 10 % of kp at the crossover wc, shared equally,
 * so they lower the phase margin by at most atan(0.1) = 5.7 deg while giving the largest gain at
 * their harmonics (the trade-off of Teodorescu, Blaabjerg, Liserre & Loh, IEE Proc. EPA 153(5), 2006).
 * Damped form: |R(j wc)| = 2 kr wb wc / |wh^2 - wc^2| (neglecting 2 wb wc << |wh^2 - wc^2|) gives
 * kr = budget * kp * |wc^2 - wh^2| / (2 wb wc); ideal form |R(j wc)| = kr wc / |wh^2 - wc^2| gives
 * kr = budget * kp * |wc^2 - wh^2| / wc.
 *
 * @param kp - proportional gain, V/A.
 * @param crossoverRadPerS - current-loop crossover target wc, rad/s.
 * @param harmonicRadPerS - resonance wh = h*w0, rad/s.
 * @param bandwidthRadPerS - wb = 2*pi*resonantBandwidthHz, rad/s (0 = ideal resonator).
 * @param harmonicCount - number of resonators sharing the budget.
 * @returns kr in V/A (the resonator's gain at wh for the damped form).
 * @example
 * defaultResonantGain(3.77, 2 * Math.PI * 1000, 2 * Math.PI * 60, Math.PI, 4); // => 93.7...
 */
export function defaultResonantGain(kp: number, crossoverRadPerS: number, harmonicRadPerS: number, bandwidthRadPerS: number, harmonicCount: number): number {
  const share = (RESONATOR_BUDGET_AT_CROSSOVER * kp) / harmonicCount;
  const separation = Math.abs(crossoverRadPerS * crossoverRadPerS - harmonicRadPerS * harmonicRadPerS);
  return bandwidthRadPerS > 0 ? (share * separation) / (2 * bandwidthRadPerS * crossoverRadPerS) : (share * separation) / crossoverRadPerS;
}

/**
 * All gains of a design: rules where the file says null, overrides elsewhere.
 *
 * @param design - a validated design.
 * @returns the gains with their sources.
 */
export function designGains(design: DesignInput): DesignedGains {
  const sources: Record<string, GainSource> = {};
  const pick = (key: string, given: number | null, rule: () => number): number => {
    sources[key] = given === null ? 'rule' : 'override';
    return given === null ? rule() : given;
  };
  const w0 = 2 * Math.PI * design.grid.frequencyHz;
  const wc = 2 * Math.PI * design.currentLoop.crossoverHz;
  const wb = 2 * Math.PI * design.currentLoop.resonantBandwidthHz;
  // kp = wc * L: crossover of the P-controlled inductor (CONTRACT section 2; Holmes et al., IEEE TPEL 24(11), 2009).
  const currentKp = pick('currentKp', design.currentLoop.kp, () => wc * totalInductanceH(design.filter));
  const harmonics = design.currentLoop.harmonics;
  sources.resonantGains = design.currentLoop.resonantGains === null ? 'rule' : 'override';
  const resonantGains = design.currentLoop.resonantGains ?? harmonics.map((h) => defaultResonantGain(currentKp, wc, h * w0, wb, harmonics.length));
  const kv = voltagePlantGain(design.grid.voltageRmsV, design.dcLink.capacitanceF, design.dcLink.voltageRefV);
  const vpi = piForIntegratorPlant(2 * Math.PI * design.voltageLoop.crossoverHz, (design.voltageLoop.phaseMarginDeg * Math.PI) / 180, kv);
  const voltageKp = pick('voltageKp', design.voltageLoop.kp, () => vpi.kp);
  const voltageKi = pick('voltageKi', design.voltageLoop.ki, () => vpi.ki);
  const pll = pllPi(design.pll.settlingTimeS, design.pll.dampingRatio);
  const pllKp = pick('pllKp', design.pll.kp, () => pll.kp);
  const pllKi = pick('pllKi', design.pll.ki, () => pll.ki);
  return { currentKp, resonantGains, voltageKp, voltageKi, voltagePlantGain: kv, pllKp, pllKi, pllNaturalRadPerS: pll.naturalRadPerS, sources };
}
