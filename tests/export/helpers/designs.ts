import type { DesignInput } from '../../../shared/control/index';

// Designs not in the repository (invented values) for the export tests.

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
