/**
 * Typed errors of the numerical core (one file, STYLE habit 8). Fatal problems throw one of these;
 * problems that are not fatal go into `notes`/`warnings` on a result instead.
 */

/** Stable machine-readable codes of the core's errors. */
export type ControlErrorCode = 'dimension' | 'improper-transfer-function' | 'timebase-mismatch' | 'mimo-not-supported' | 'invalid-argument' | 'no-convergence';

/**
 * Base class of every error the numerical core throws; the server maps it to HTTP 422.
 * @example
 * new ControlError('invalid-argument', 'samplePeriodS must be > 0').code; // => 'invalid-argument'
 */
export class ControlError extends Error {
  /** Stable code, e.g. `timebase-mismatch`. */
  readonly code: ControlErrorCode;

  /**
   * @param code - stable machine-readable code.
   * @param message - human-readable sentence naming the argument and the rule.
   */
  constructor(code: ControlErrorCode, message: string) {
    super(message);
    this.name = 'ControlError';
    this.code = code;
  }
}

/**
 * Matrix or vector sizes that do not fit together.
 * @example
 * new DimensionError('A is 2x3, expected square').code; // => 'dimension'
 */
export class DimensionError extends ControlError {
  /** @param message - which sizes disagree. */
  constructor(message: string) {
    super('dimension', message);
    this.name = 'DimensionError';
  }
}

/**
 * A transfer function whose numerator degree exceeds its denominator degree where a proper one is required.
 * @example
 * new ImproperTransferFunctionError('numerator degree 3 > denominator degree 2').code; // => 'improper-transfer-function'
 */
export class ImproperTransferFunctionError extends ControlError {
  /** @param message - the degrees involved. */
  constructor(message: string) {
    super('improper-transfer-function', message);
    this.name = 'ImproperTransferFunctionError';
  }
}

/**
 * Two systems with different timebases (continuous vs discrete, or different sampling periods) combined.
 * @example
 * new TimebaseMismatchError('continuous vs discrete 5e-5 s').code; // => 'timebase-mismatch'
 */
export class TimebaseMismatchError extends ControlError {
  /** @param message - the two timebases. */
  constructor(message: string) {
    super('timebase-mismatch', message);
    this.name = 'TimebaseMismatchError';
  }
}

/**
 * A multi-input or multi-output system given where only SISO is supported.
 * @example
 * new MimoNotSupportedError('B has 2 columns').code; // => 'mimo-not-supported'
 */
export class MimoNotSupportedError extends ControlError {
  /** @param message - which dimension is not 1. */
  constructor(message: string) {
    super('mimo-not-supported', message);
    this.name = 'MimoNotSupportedError';
  }
}
