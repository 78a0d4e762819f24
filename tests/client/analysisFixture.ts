// A hand-made analysis result for display tests (values invented; the shapes follow CONTRACT section 3).
import type { AnalysisResult } from '../../shared/control';

/**
 * An analysis with one resonator that drifts in fixed point (error) and one warning.
 * @returns the result.
 */
export function buildAnalysis(): AnalysisResult {
  const fixed = (b: number[], a: number[], qFormat: string, fracBits: number) => ({ wordBits: 16, fracBits, b, a, qFormat });
  return {
    format: 'varsmith-analysis/1',
    sampleTimeS: 5e-5,
    blocks: [
      {
        id: 'current-pr', method: 'tustin-prewarp', gains: { kp: 3.7699111843077517, resonantGains: [150, 40] },
        sections: [
          { role: 'proportional', kind: 'gain', prewarpHz: null, b: [3.77, 0, 0], a: [1, 0, 0], fixed: fixed([30881, 0, 0], [8192, 0, 0], 'Q3.13', 13) },
          { role: 'resonant-h1', kind: 'resonator', prewarpHz: 50, b: [0.0047, 0, -0.0047], a: [1, -1.9996, 0.9998],
            resonanceHz: { design: 50, discrete: 50, fixed: 52.61 }, resonanceByMethodHz: { tustin: 49.9959, 'tustin-prewarp': 50, zoh: 50 },
            fixed: fixed([154, 0, -154], [16384, -32761, 16381], 'Q2.14', 14),
            fixedAnalysis: { dcGain: { discrete: 0, fixed: 0 }, maxPoleRadiusFixed: 0.99991, outputL1Norm: 12.5, headroomBits: 4, deadbandLsb: 2.5, lostCoefficients: [] } },
          { role: 'resonant-h3', kind: 'resonator', prewarpHz: 150, b: [0.0012, 0, -0.0012], a: [1, -1.9955, 0.9998],
            resonanceHz: { design: 150, discrete: 150, fixed: 150.02 }, resonanceByMethodHz: { tustin: 149.889, 'tustin-prewarp': 150, zoh: 150 },
            fixed: fixed([39, 0, -39], [16384, -32694, 16381], 'Q2.14', 14),
            fixedAnalysis: { dcGain: { discrete: 0, fixed: 0 }, maxPoleRadiusFixed: 0.99991, outputL1Norm: 3.1, headroomBits: 2, deadbandLsb: 0.8, lostCoefficients: ['b1'] } },
        ],
      },
    ],
    loops: [
      { id: 'current', crossoverHz: 985.1, phaseMarginDeg: 52.3, gainMarginDb: 9.1, peakSensitivity: 1.62, closedLoopPoles: [[0.5, 0.2], [0.5, -0.2]], maxPoleRadius: 0.9812, stable: true },
      { id: 'voltage', crossoverHz: 12.2, phaseMarginDeg: 59.8, gainMarginDb: null, peakSensitivity: 1.2, closedLoopPoles: [[1.0002, 0]], maxPoleRadius: 1.0002, stable: false, notes: ['no phase crossing below Nyquist'] },
    ],
    plant: { ratedCurrentA: 14.3 },
    checks: [
      { id: 'plant-inductor-drop', severity: 'info', message: 'Inductor drop is 4.8 % of grid voltage.', value: 0.048, limit: 0.05, unit: 'fraction' },
      { id: 'pr-h1-quantization-drift', severity: 'error', message: 'Resonance h1 moves 2.61 Hz in 16-bit fixed point.', value: 2.61, limit: 0.05, unit: 'Hz', blockId: 'current-pr', remedy: 'Use 32-bit words for the resonators.' },
      { id: 'pr-h3-deadband', severity: 'warning', message: 'Resonator h3 can stall 0.8 LSB off.', value: 0.8, limit: 0.5, unit: 'LSB', blockId: 'current-pr', remedy: null },
    ],
  };
}

/**
 * The same analysis with plot data: a first-order open loop k/(j f) sampled on a log grid
 * (|L| = 1 at 1 kHz, phase -90 degrees, so the phase margin is 90 degrees), and one step.
 * @returns the result with `responses`.
 */
export function buildAnalysisWithPlots(): AnalysisResult {
  const result = buildAnalysis();
  const frequencyHz = Array.from({ length: 41 }, (_, i) => 10 ** (1 + (3 * i) / 40));
  const openLoop = {
    frequencyHz,
    magnitudeDb: frequencyHz.map((f) => 20 * Math.log10(1000 / f)),
    phaseDeg: frequencyHz.map(() => -90),
  };
  result.loops[0] = { ...result.loops[0], crossoverHz: 1000, phaseMarginDeg: 90, gainMarginDb: null, crossings: [{ frequencyHz: 1000, marginValue: 90, kind: 'gain-crossover' }] };
  result.responses = {
    openLoop: { current: openLoop, voltage: openLoop, pll: openLoop },
    time: { 'current-step': { timeS: [0, 5e-5, 1e-4], value: [0, 0.6, 1], label: 'inverter current (A) for a 1 A reference step' } },
    poleZero: { current: { poles: [[1, 0]], zeros: [[-1, 0]] }, voltage: { poles: [], zeros: [] }, pll: { poles: [], zeros: [] } },
  };
  return result;
}
