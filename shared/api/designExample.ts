// The example design of CONTRACT section 1 (an L-filter 3.3 kVA 120 V 60 Hz unit, every gain designed
// by rule): the starting point of "new design" in the client and the base of test factories and benches.
import type { DesignInput } from '../control/types';

/**
 * A fresh copy of the contract's example design under another name.
 *
 * @param name - the design's name.
 * @returns a complete, valid `varsmith-design/1` design (a new object each call).
 * @example
 * contractExampleDesign('Bench A').filter; // => { topology: 'L', inductanceH: 0.0006, resistanceOhm: 0.03 }
 */
export function contractExampleDesign(name: string): DesignInput {
  return {
    format: 'varsmith-design/1',
    name,
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
}
