/**
 * Typed errors of the system simulation. Validation happens at the public entry points
 * (`simulateScenario`, `createPlant`); the inner loops trust their inputs.
 */

/** What went wrong: a bad option (names its path), a run beyond the caps, a diverging run, or a stop asked by the caller. */
export type SimulationErrorCode = 'invalid-option' | 'too-long' | 'diverged' | 'cancelled';

/** An error of the simulation, with a stable code and the option path it concerns (null when none). */
export class SimulationError extends Error {
  /** Stable code for callers (CLI exit status, HTTP status). */
  readonly code: SimulationErrorCode;
  /** Dotted path of the offending option, e.g. `durationS`, or null. */
  readonly path: string | null;

  /**
   * @param code - stable code.
   * @param message - one sentence naming the rule broken.
   * @param path - option path, or null.
   */
  constructor(code: SimulationErrorCode, message: string, path: string | null = null) {
    super(message);
    this.name = 'SimulationError';
    this.code = code;
    this.path = path;
  }
}
