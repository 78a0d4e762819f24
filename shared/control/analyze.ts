/**
 * The whole pipeline for one design: gains, discrete sections, fixed point, loops, plant and
 * checks, as a `varsmith-analysis/1` result (CONTRACT section 3). Pure and deterministic.
 */
import { forEachStepSample, sectionResponse, type SectionPair } from './blocks';
import { designGains } from './designRules';
import { fixedPointChecks } from './fixedPoint';
import { float32Checks } from './float32';
import { limitChecks } from './limits';
import { analyzeLoops } from './loops';
import { BANDWIDTH_SEPARATION_MIN, plantChecks, THIRD_HARMONIC_LIMIT } from './plant';
import { quantizeBlocks } from './quantization';
import { scaleBlocks } from './scaling';
import { designSections } from './sections';
import { blockSignals, resolveSignals } from './signals';
import type { AnalysisOptions, AnalysisResult, BlockResult, Check, DesignInput, LoopResult, TimeResponseData } from './types';

/** Phase-margin target below which a loop gets a warning, deg (Åström & Hägglund, "Advanced PID Control", 2006: 45–60°). */
export const PHASE_MARGIN_TARGET_DEG = 45;
/** Gain-margin target, dB (Skogestad & Postlethwaite, "Multivariable Feedback Control", 2005: GM ≥ 6 dB). */
export const GAIN_MARGIN_TARGET_DB = 6;
/** Peak-sensitivity limit (Åström & Hägglund 2006: Ms 1.2–2.0; Ms = 2 guarantees GM ≥ 6 dB, PM ≥ 29°). */
export const PEAK_SENSITIVITY_LIMIT = 2;

// Checks of the arithmetic the set ships in: the W-bit fixed point, or binary32.
function arithmeticChecks(design: DesignInput, blocks: readonly BlockResult[], samplePeriodS: number): Check[] {
  if (resolveSignals(design).arithmetic === 'float32') return float32Checks(blocks, { samplePeriodS, signals: blockSignals(design) });
  return fixedPointChecks(blocks, { samplePeriodS, wordBits: design.fixedPoint.wordBits, gridFrequencyHz: design.grid.frequencyHz });
}

// Stability checks of one loop (severities of CONTRACT/issue: unstable → error, below targets → warning).
function loopChecks(loop: LoopResult): Check[] {
  const name = { current: 'Current loop', voltage: 'DC-link voltage loop', pll: 'PLL loop' }[loop.id];
  const checks: Check[] = [];
  checks.push({
    id: `loop-${loop.id}-stability`,
    severity: loop.stable ? 'info' : 'error',
    message: loop.stable
      ? `${name} is stable: largest closed-loop pole radius ${loop.maxPoleRadius.toFixed(6)}.`
      : `${name} is UNSTABLE: a closed-loop pole has radius ${loop.maxPoleRadius.toFixed(6)} ≥ 1.`,
    value: loop.maxPoleRadius, limit: 1, unit: null,
    remedy: loop.stable ? null : 'Lower the crossover target or the resonant gains, or reduce the computation delay.',
  });
  if (loop.phaseMarginDeg !== null) {
    const low = loop.phaseMarginDeg < PHASE_MARGIN_TARGET_DEG;
    checks.push({ id: `loop-${loop.id}-phase-margin`, severity: low ? 'warning' : 'info', message: `${name} phase margin ${loop.phaseMarginDeg.toFixed(1)}° (target ≥ ${PHASE_MARGIN_TARGET_DEG}°).`, value: loop.phaseMarginDeg, limit: PHASE_MARGIN_TARGET_DEG, unit: 'deg', remedy: low ? 'Lower the crossover target.' : null });
  }
  if (loop.gainMarginDb !== null) {
    const low = loop.gainMarginDb < GAIN_MARGIN_TARGET_DB;
    checks.push({ id: `loop-${loop.id}-gain-margin`, severity: low ? 'warning' : 'info', message: `${name} gain margin ${loop.gainMarginDb.toFixed(2)} dB (target ≥ ${GAIN_MARGIN_TARGET_DB} dB).`, value: loop.gainMarginDb, limit: GAIN_MARGIN_TARGET_DB, unit: 'dB', remedy: low ? 'Lower the proportional gain.' : null });
  }
  const highMs = loop.peakSensitivity > PEAK_SENSITIVITY_LIMIT;
  checks.push({ id: `loop-${loop.id}-peak-sensitivity`, severity: highMs ? 'warning' : 'info', message: `${name} peak sensitivity ${loop.peakSensitivity.toFixed(3)} (limit ${PEAK_SENSITIVITY_LIMIT}).`, value: loop.peakSensitivity, limit: PEAK_SENSITIVITY_LIMIT, unit: null, remedy: highMs ? 'Lower the crossover target or add damping.' : null });
  return checks;
}

// Unit-step response of a double-precision section, subsampled to `samples` points over `horizonS`.
function sectionStep(pair: SectionPair, samplePeriodS: number, horizonS: number, samples: number, label: string): TimeResponseData {
  const total = Math.max(samples, Math.ceil(horizonS / samplePeriodS));
  const stride = Math.max(1, Math.floor(total / samples));
  const timeS: number[] = [];
  const value: number[] = [];
  forEachStepSample(pair, stride * samples, (i, y) => {
    if (i % stride === 0) { timeS.push(i * samplePeriodS); value.push(y); }
  });
  return { timeS, value, label };
}

/**
 * Full analysis of a validated design.
 *
 * @param design - a validated `varsmith-design/1` design (see `parseDesign`); SI units.
 * @param options - plot sizes (0 = none); they change only `responses`, never any other number.
 * @returns the `varsmith-analysis/1` result: blocks with double and quantized sections, loops,
 *   plant summary and checks (plant, design, stability, fixed point), plus plot data when asked.
 * @example
 * analyzeDesign(design, { sweepPoints: 0, responseSamples: 0 }).loops[0].stable; // => true
 */
export function analyzeDesign(design: DesignInput, options: AnalysisOptions): AnalysisResult {
  const samplePeriodS = 1 / (design.sampling.switchingFrequencyHz * design.sampling.updatesPerCarrier);
  const f0 = design.grid.frequencyHz;
  const gains = designGains(design);
  const sections = designSections(design, gains, samplePeriodS);
  const pairs = sections.pairs;
  const blocks = quantizeBlocks(design, scaleBlocks(design, sections.blocks), samplePeriodS);
  const loopAnalysis = analyzeLoops(
    {
      samplePeriodS,
      computationDelaySamples: design.sampling.computationDelaySamples,
      filter: design.filter,
      currentController: pairs.current,
      voltageController: pairs.voltage,
      voltagePlantGain: gains.voltagePlantGain,
      pllController: pairs.pll,
    },
    options,
  );
  const plant = plantChecks(design, pairs.lpf, samplePeriodS);
  const checks: Check[] = [...plant.checks];

  // Design checks: resonators above the current-loop crossover are inside the loop's phase-critical band.
  design.currentLoop.harmonics.forEach((h) => {
    if (h * f0 >= design.currentLoop.crossoverHz) {
      checks.push({ id: `pr-h${h}-above-crossover`, severity: 'warning', blockId: 'current-pr', message: `Resonator h${h} (${h * f0} Hz) lies at or above the current-loop crossover target (${design.currentLoop.crossoverHz} Hz); it cannot track there and erodes the phase margin.`, value: h * f0, limit: design.currentLoop.crossoverHz, unit: 'Hz', remedy: 'Drop this harmonic or raise the crossover target.' });
    }
  });

  // DC-link ripple through the voltage PI (REFERENCES: third harmonic ≈ |C_pi(j2ω)|·ΔV_peak/2).
  const cAt2w = sectionResponse(pairs.voltage, 2 * f0, samplePeriodS);
  const voltagePiGainAt2f0 = Math.hypot(cAt2w.re, cAt2w.im);
  const ripplePeakV = plant.summary.dcLinkRipplePeakToPeakV / 2;
  const thirdHarmonicCurrentA = (voltagePiGainAt2f0 * ripplePeakV) / 2;
  const thirdHarmonicFraction = thirdHarmonicCurrentA / plant.summary.ratedPeakCurrentA;
  checks.push({ id: 'voltage-loop-third-harmonic', severity: thirdHarmonicFraction > THIRD_HARMONIC_LIMIT ? 'warning' : 'info', blockId: 'voltage-pi', message: `The DC-link PI passes the ${2 * f0} Hz ripple as ${thirdHarmonicCurrentA.toFixed(3)} A of third-harmonic current amplitude (${(thirdHarmonicFraction * 100).toFixed(2)} % of rated peak).`, value: thirdHarmonicFraction, limit: THIRD_HARMONIC_LIMIT, unit: 'fraction', remedy: thirdHarmonicFraction > THIRD_HARMONIC_LIMIT ? 'Lower the voltage-loop crossover or add a notch at twice grid frequency.' : null });

  const current = loopAnalysis.loops.find((l) => l.id === 'current');
  const voltage = loopAnalysis.loops.find((l) => l.id === 'voltage');
  const separation = current?.crossoverHz && voltage?.crossoverHz ? current.crossoverHz / voltage.crossoverHz : null;
  if (separation !== null) {
    const low = separation < BANDWIDTH_SEPARATION_MIN;
    checks.push({ id: 'loop-bandwidth-separation', severity: low ? 'warning' : 'info', message: `Current-loop crossover is ${separation.toFixed(1)} × the voltage-loop crossover (at least ${BANDWIDTH_SEPARATION_MIN} × keeps the inner loop ideal for the outer one).`, value: separation, limit: BANDWIDTH_SEPARATION_MIN, unit: 'ratio', remedy: low ? 'Lower the voltage-loop crossover.' : null });
  }
  for (const loop of loopAnalysis.loops) checks.push(...loopChecks(loop));
  checks.push(...arithmeticChecks(design, blocks, samplePeriodS));
  checks.push(...limitChecks(design, plant.summary));

  const result: AnalysisResult = {
    format: 'varsmith-analysis/1',
    sampleTimeS: samplePeriodS,
    blocks,
    loops: loopAnalysis.loops,
    plant: {
      ...plant.summary,
      voltagePiGainAt2f0,
      thirdHarmonicCurrentA,
      bandwidthSeparation: separation,
    },
    checks,
  };
  if (options.sweepPoints > 0 || options.responseSamples > 0) {
    const time: Record<string, TimeResponseData> = { ...(loopAnalysis.time ?? {}) };
    if (options.responseSamples > 0) {
      const settle = plant.summary.estimatorSettlingTimeS ?? 1 / design.reactiveFilter.cutoffHz;
      time['estimator-step'] = sectionStep(pairs.lpf, samplePeriodS, 1.5 * settle, options.responseSamples, 'reactive-current estimate (per unit) for a unit step of the product term');
    }
    result.responses = {
      openLoop: loopAnalysis.openLoop ?? { current: emptySweep(), voltage: emptySweep(), pll: emptySweep() },
      time,
      ...(loopAnalysis.poleZero ? { poleZero: loopAnalysis.poleZero } : {}),
    };
  }
  return result;
}

// An empty frequency sweep (no plot data asked for).
function emptySweep() {
  return { frequencyHz: [], magnitudeDb: [], phaseDeg: [] };
}
