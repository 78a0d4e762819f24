/**
 * Sensing and modulation as the firmware sees them: SI values to signed ADC codes, compare counts
 * to leg duty. The scale factors come from the design's resolved signals (CONTRACT section 7,
 * `resolveSignals`), the same ones the exported set's conversion constants use, so plant and
 * firmware agree on what one code and one count mean.
 */
import { resolveSignals, type DesignInput } from '../control';

/** Whether the sensed values and compare counts are rounded to integers as on the target (`firmware`), or left real (`none`, for validation against references). */
export type Quantization = 'firmware' | 'none';

/** ADC and PWM scaling of a design. */
export interface Sensing {
  adcBits: number;
  /** Most negative code, -2^(N-1). */
  codeMin: number;
  /** Most positive code, 2^(N-1) - 1. */
  codeMax: number;
  /** Inverter and load current per code, A (full scale / 2^(N-1)). */
  currentAPerCode: number;
  /** Grid voltage per code, V. */
  gridVoltageVPerCode: number;
  /** DC-link voltage per code, V. */
  dcVoltageVPerCode: number;
  /** PWM carrier period in counts (up-down counter from 0 to this and back). */
  carrierCounts: number;
}

/**
 * The sensing and PWM scaling of a design: signed codes in [-2^(N-1), 2^(N-1) - 1] span +-full scale,
 * so one code is fullScale / 2^(N-1) (CONTRACT section 7, as `conversionConstants`).
 *
 * @param design - a validated design.
 * @returns the scaling, SI per code.
 * @example
 * designSensing(sc3).currentAPerCode; // => 77.78 / 2048 = 0.03798 A
 */
export function designSensing(design: DesignInput): Sensing {
  const r = resolveSignals(design);
  const half = 2 ** (r.adcBits - 1);
  return {
    adcBits: r.adcBits,
    codeMin: -half,
    codeMax: half - 1,
    currentAPerCode: r.currentSenseFullScaleA / half,
    gridVoltageVPerCode: r.gridVoltageSenseFullScaleV / half,
    dcVoltageVPerCode: r.dcVoltageSenseFullScaleV / half,
    carrierCounts: r.pwmCarrierCounts,
  };
}

/**
 * The ADC code of a sensed value: value / (SI per code), rounded half away from zero and saturated
 * to the code range (`firmware`), or the unrounded ratio clipped to the same range (`none`).
 *
 * @param value - sensed quantity, SI (A or V).
 * @param perCode - SI per code.
 * @param sensing - code range.
 * @param quantization - `firmware` or `none`.
 * @returns the code.
 * @example
 * adcCode(10, 0.03798, s, 'firmware'); // => 263
 */
export function adcCode(value: number, perCode: number, sensing: Sensing, quantization: Quantization): number {
  const ratio = value / perCode;
  const code = quantization === 'firmware' ? Math.sign(ratio) * Math.round(Math.abs(ratio)) : ratio;
  return Math.min(sensing.codeMax, Math.max(sensing.codeMin, code));
}

/**
 * Duty of one bridge leg from its compare value: the leg is high while the up-down carrier counter
 * is below the compare value, so it is high for compare / counts of each half carrier period
 * (centre-aligned PWM; Holmes & Lipo, "Pulse Width Modulation for Power Converters", 2003, from memory).
 *
 * @param compare - compare value, counts (clamped to [0, counts]).
 * @param carrierCounts - carrier period in counts.
 * @returns the duty in [0, 1].
 * @example
 * legDuty(1875, 2500); // => 0.75
 */
export function legDuty(compare: number, carrierCounts: number): number {
  return Math.min(1, Math.max(0, compare / carrierCounts));
}

/**
 * Unipolar compare values of the two legs for a modulation index m in [-1, 1]: leg A at
 * counts (1 + m) / 2, leg B at counts (1 - m) / 2, so the bridge's average voltage is m v_dc
 * (counts per unit of m = counts / 2, CONTRACT section 7 `countsPerModulation`).
 *
 * @param modulation - m (clamped by the caller).
 * @param carrierCounts - carrier period in counts.
 * @param quantization - `firmware` rounds to whole counts (half up), `none` keeps them real.
 * @returns `{ compareA, compareB }`.
 * @example
 * unipolarCompares(0.5, 2500, 'firmware'); // => { compareA: 1875, compareB: 625 }
 */
export function unipolarCompares(modulation: number, carrierCounts: number, quantization: Quantization): { compareA: number; compareB: number } {
  const half = carrierCounts / 2;
  const a = half * (1 + modulation);
  const b = half * (1 - modulation);
  return quantization === 'firmware' ? { compareA: Math.round(a), compareB: Math.round(b) } : { compareA: a, compareB: b };
}
