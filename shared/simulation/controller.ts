/**
 * The seam between the plant and the controller in the loop: once per sample the simulator hands
 * the controller the signed ADC codes it would read and takes back the two compare values it would
 * write. Any per-sample control step fits behind it — the double-precision reference of this folder,
 * or a bit-exact firmware model — with no change to the simulator.
 */

/** Signed ADC codes of one sample (see `designSensing` for what one code is). */
export interface AdcCodes {
  /** Inverter-side filter current (out of the bridge), code. */
  inverterCurrent: number;
  /** Load current at the point of connection, code. */
  loadCurrent: number;
  /** Grid voltage at the point of connection, code. */
  gridVoltage: number;
  /** DC-link voltage, code. */
  dcVoltage: number;
}

/** What the control step writes and logs for one sample. */
export interface ControllerOutput {
  /** Unipolar compare value of leg A, counts in [0, carrier counts]. */
  compareA: number;
  /** Compare value of leg B, counts. */
  compareB: number;
  /**
   * Internal signals for plots, SI with the unit in the key. The simulator plots the keys of
   * {@link CONTROLLER_LOG_KEYS} when present; a controller may log more.
   */
  log: Record<string, number>;
}

/** A per-sample controller: reset to its initial state, then one step per sample. */
export interface SampledController {
  /** Returns every state to its value after init. */
  reset(): void;
  /**
   * One control step.
   * @param codes - the sampled ADC codes.
   * @returns the compare values (applied after the design's computation delay) and the log.
   */
  step(codes: AdcCodes): ControllerOutput;
}

/** The log keys the simulator reads (all optional): what each holds. */
export const CONTROLLER_LOG_KEYS = {
  /** PLL frequency, Hz. */
  pllFrequencyHz: 'pllFrequencyHz',
  /** PLL angle used for this sample's templates, rad in [0, 2 pi); the grid voltage is taken as sin(angle). */
  pllAngleRad: 'pllAngleRad',
  /** Estimated load current along the cos template (2 x low-passed i_load cos theta), A; negative for an inductive load. */
  reactiveCurrentEstimateA: 'reactiveCurrentEstimateA',
  /** Instantaneous inverter current reference, A. */
  currentReferenceA: 'currentReferenceA',
  /** Active current amplitude from the DC-link PI (positive draws power into the DC link), A. */
  activeCurrentReferenceA: 'activeCurrentReferenceA',
  /** Modulation index after the clamp. */
  modulationIndex: 'modulationIndex',
} as const;
