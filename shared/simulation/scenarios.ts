/**
 * The scenarios of CONTRACT section 10: what the load and the grid do over a run.
 *
 * - `steady`: nominal grid; a series R-L load drawing the rating's apparent power at power factor
 *   0.8 lagging (CONTRACT section 10).
 * - `reactive-step`: that load, then at the event an R-C load of the same apparent power at 0.8
 *   leading closes and the R-L load opens at its next current zero (as an AC breaker interrupts).
 * - `frequency-step`: at the event the grid frequency steps, phase-continuously, to the edge of the
 *   design's `envelope.gridFrequencyHz` band farther from nominal (the lower one on a tie), or by
 *   -1 % of nominal when the design has no band.
 * - `voltage-sag`: at the event the grid voltage drops by 10 %.
 * Events fall on a sample instant.
 */
import type { DesignInput } from '../control';
import type { SourceSegment } from './grid';
import { branchPower, seriesLoadForPower } from './loads';
import type { LoadBranch } from './network';
import type { LoadSwitchEvent } from './engine';
import type { ScenarioId } from './types';

/** Power factor of the steady load (CONTRACT section 10). */
export const STEADY_LOAD_POWER_FACTOR = 0.8;

/** Grid voltage during the sag, fraction of nominal (-10 %). */
export const VOLTAGE_SAG_SCALE = 0.9;

/**
 * Frequency step without an envelope band: -1 % of nominal, the edge of the band EN 50160 gives
 * for interconnected systems (50 Hz +-1 % for 99.5 % of a year, from memory).
 */
export const DEFAULT_FREQUENCY_STEP_FRACTION = -0.01;

/** Grid cycles the metrics cover (CONTRACT section 10). */
export const METRIC_WINDOW_CYCLES = 5;

/** Default recorded lengths, s: long enough for the slow loops (DC link near 10 Hz) to settle after an event at 0.1 s. */
export const DEFAULT_DURATION_S: Readonly<Record<ScenarioId, number>> = {
  steady: 0.25,
  'reactive-step': 0.6,
  'frequency-step': 0.6,
  'voltage-sag': 0.6,
};

/** Event time: 0.1 s, or a quarter of a shorter run. */
export const EVENT_TIME_MAX_S = 0.1;

/** A scenario made concrete for a design (times on the recorded clock). */
export interface ScenarioPlan {
  loads: LoadBranch[];
  initialClosed: boolean[];
  loadEvents: LoadSwitchEvent[];
  /** Source frequency and amplitude over time (first segment from 0). */
  segments: SourceSegment[];
  eventTimeS: number | null;
  /** The load and what happens, in words. */
  description: string;
}

/**
 * Where the frequency step goes (see the module comment).
 *
 * @param design - the design.
 * @returns the target frequency and where it came from.
 * @example
 * frequencyStepTarget(sc3); // => { frequencyHz: 59.4, source: 'default' }
 */
export function frequencyStepTarget(design: DesignInput): { frequencyHz: number; source: 'envelope' | 'default' } {
  const f0 = design.grid.frequencyHz;
  const band = design.envelope?.gridFrequencyHz;
  if (!band) return { frequencyHz: f0 * (1 + DEFAULT_FREQUENCY_STEP_FRACTION), source: 'default' };
  return { frequencyHz: f0 - band[0] >= band[1] - f0 ? band[0] : band[1], source: 'envelope' };
}

function describeBranch(b: LoadBranch): string {
  return b.kind === 'series-rl'
    ? `series R-L ${b.resistanceOhm.toPrecision(4)} ohm + ${(b.inductanceH * 1e3).toPrecision(4)} mH`
    : `series R-C ${b.resistanceOhm.toPrecision(4)} ohm + ${(b.capacitanceF * 1e6).toPrecision(4)} uF`;
}

/**
 * The plan of a scenario.
 *
 * @param design - the design (rating, grid, envelope).
 * @param scenario - which scenario.
 * @param durationS - recorded length, s.
 * @param samplePeriodS - control sample period, s (events are put on a sample).
 * @returns loads, events and source segments on the recorded clock.
 * @example
 * scenarioPlan(sc3, 'steady', 0.25, 5e-5).loads.length; // => 1
 */
export function scenarioPlan(design: DesignInput, scenario: ScenarioId, durationS: number, samplePeriodS: number): ScenarioPlan {
  const v = design.grid.voltageRmsV;
  const f0 = design.grid.frequencyHz;
  const s = design.rating.apparentPowerVA;
  const inductive = seriesLoadForPower(v, f0, s, STEADY_LOAD_POWER_FACTOR, 'lagging');
  const loadText = `${describeBranch(inductive)} (${s} VA at power factor ${STEADY_LOAD_POWER_FACTOR} lagging)`;
  const eventTimeS = scenario === 'steady' ? null : Math.round(Math.min(EVENT_TIME_MAX_S, durationS / 4) / samplePeriodS) * samplePeriodS;
  const nominal: SourceSegment = { fromS: 0, frequencyHz: f0, amplitudeScale: 1 };
  const base = { loads: [inductive], initialClosed: [true], loadEvents: [] as LoadSwitchEvent[], segments: [nominal], eventTimeS };
  switch (scenario) {
    case 'steady':
      return { ...base, description: `${loadText}; nominal grid.` };
    case 'reactive-step': {
      const capacitive = seriesLoadForPower(v, f0, s, STEADY_LOAD_POWER_FACTOR, 'leading');
      const at = eventTimeS ?? 0;
      return {
        ...base,
        loads: [inductive, capacitive],
        initialClosed: [true, false],
        loadEvents: [{ branch: 1, action: 'close', atS: at }, { branch: 0, action: 'open-at-current-zero', atS: at }],
        description: `${loadText}; at ${at.toFixed(4)} s ${describeBranch(capacitive)} (${s} VA at ${STEADY_LOAD_POWER_FACTOR} leading) closes and the R-L load opens at its next current zero.`,
      };
    }
    case 'frequency-step': {
      const target = frequencyStepTarget(design);
      const at = eventTimeS ?? 0;
      return {
        ...base,
        segments: [nominal, { fromS: at, frequencyHz: target.frequencyHz, amplitudeScale: 1 }],
        description: `${loadText}; at ${at.toFixed(4)} s the grid frequency steps to ${target.frequencyHz} Hz (${target.source === 'envelope' ? 'edge of envelope.gridFrequencyHz' : `${DEFAULT_FREQUENCY_STEP_FRACTION * 100} % of nominal: the design has no envelope band`}).`,
      };
    }
    case 'voltage-sag': {
      const at = eventTimeS ?? 0;
      return {
        ...base,
        segments: [nominal, { fromS: at, frequencyHz: f0, amplitudeScale: VOLTAGE_SAG_SCALE }],
        description: `${loadText}; at ${at.toFixed(4)} s the grid voltage sags to ${VOLTAGE_SAG_SCALE * 100} % of nominal.`,
      };
    }
  }
}

/**
 * The load a plan ends with, at nominal voltage and frequency (phasor values).
 *
 * @param plan - the plan.
 * @param voltageRmsV - nominal voltage, V rms.
 * @param frequencyHz - nominal frequency, Hz.
 * @returns active and reactive power of the branches closed at the end.
 * @example
 * finalLoadPower(plan, 120, 60); // => { activePowerW: 2640, reactivePowerVar: 1980 }
 */
export function finalLoadPower(plan: ScenarioPlan, voltageRmsV: number, frequencyHz: number): { activePowerW: number; reactivePowerVar: number } {
  const closed = [...plan.initialClosed];
  for (const e of plan.loadEvents) closed[e.branch] = e.action === 'close';
  let p = 0;
  let q = 0;
  plan.loads.forEach((b, k) => {
    if (!closed[k]) return;
    const power = branchPower(b, voltageRmsV, frequencyHz);
    p += power.activePowerW;
    q += power.reactivePowerVar;
  });
  return { activePowerW: p, reactivePowerVar: q };
}
