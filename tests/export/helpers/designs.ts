import type { DesignInput } from '../../../shared/control/index';
import { contractExampleDesign } from '../../../shared/api/designExample';

// Designs not in the repository (invented values) for the export tests.

/** Demo-like designs not in the repository (invented values): L 32-bit, LCL 16-bit. */
export const L32_DESIGN: DesignInput = contractExampleDesign('Harbour test rig A');

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
