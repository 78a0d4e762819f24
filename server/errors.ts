// The one application error (STYLE habit 19). Services throw it; the error handler turns it into
// `{ error: { code, message, fields? } }` with its HTTP status.

/** A field-level problem. */
export interface FieldProblem {
  path: string;
  message: string;
}

/** An expected failure with a stable code and an HTTP status. */
export class AppError extends Error {
  readonly code: string;
  readonly status: number;
  readonly fields: FieldProblem[] | undefined;
  readonly details: Record<string, unknown> | undefined;

  constructor(code: string, message: string, status: number, extra: { fields?: FieldProblem[]; details?: Record<string, unknown> } = {}) {
    super(message);
    this.name = 'AppError';
    this.code = code;
    this.status = status;
    this.fields = extra.fields;
    this.details = extra.details;
  }
}

/** 400 with field paths. */
export const validationError = (fields: FieldProblem[], message = 'invalid input'): AppError =>
  new AppError('validation', `${message}: ${fields.map((f) => `${f.path || '(body)'} ${f.message}`).join('; ')}`, 400, { fields });
/** 401. */
export const unauthorized = (message = 'sign in first'): AppError => new AppError('unauthorized', message, 401);
/** 403. */
export const forbidden = (message: string): AppError => new AppError('forbidden', message, 403);
/** 404. */
export const notFound = (what: string): AppError => new AppError('not-found', `${what} not found`, 404);
/** 409. */
export const conflict = (code: string, message: string, details?: Record<string, unknown>): AppError => new AppError(code, message, 409, { details });
