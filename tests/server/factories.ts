// Factories for test data (the design values are the example of CONTRACT section 1).
import type { DesignInput } from '../../shared/control';

/**
 * A valid L-filter design.
 * @param overrides - top-level fields to replace.
 * @returns the design.
 */
export function buildDesign(overrides: Partial<DesignInput> = {}): DesignInput {
  return {
    format: 'varsmith-design/1',
    name: 'SC-3 bench unit',
    grid: { voltageRmsV: 120, frequencyHz: 60 },
    rating: { apparentPowerVA: 3300 },
    filter: { topology: 'L', inductanceH: 0.0006, resistanceOhm: 0.03 },
    dcLink: { capacitanceF: 0.0022, voltageRefV: 200 },
    sampling: { switchingFrequencyHz: 20000, updatesPerCarrier: 1, computationDelaySamples: 1 },
    currentLoop: { crossoverHz: 1000, harmonics: [1, 3, 5, 7], resonantBandwidthHz: 0.5, kp: null, resonantGains: null },
    voltageLoop: { crossoverHz: 12, phaseMarginDeg: 60, kp: null, ki: null },
    pll: { sogiGain: 1.4142135623730951, settlingTimeS: 0.06, dampingRatio: 0.7071, kp: null, ki: null },
    reactiveFilter: { order: 2, cutoffHz: 10 },
    fixedPoint: { wordBits: 32 },
    ...overrides,
  } as DesignInput;
}
