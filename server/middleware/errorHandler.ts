// The one error handler (STYLE habit 19): every failure leaves as `{ error: { code, message, fields? } }`.
import type { ErrorRequestHandler, RequestHandler } from 'express';
import { UniqueConstraintError } from 'sequelize';
import { AppError } from '../errors';

/** 404 for unknown API paths. */
export const apiNotFound: RequestHandler = (req, _res, next) => {
  next(new AppError('not-found', `no route ${req.method} ${req.path}`, 404));
};

/**
 * Builds the error middleware.
 * @param log - where unexpected errors are written.
 * @returns the middleware.
 */
export function errorHandler(log: (message: string) => void): ErrorRequestHandler {
  return (err, _req, res, _next) => {
    void _next;
    let error: AppError;
    const type = (err as { type?: string }).type;
    if (err instanceof AppError) error = err;
    else if (type === 'entity.too.large') error = new AppError('payload-too-large', 'request body is larger than the 1 MB limit', 413);
    else if (type === 'entity.parse.failed') error = new AppError('malformed-json', `request body is not valid JSON: ${(err as Error).message}`, 400, { fields: [{ path: '(body)', message: 'must be valid JSON' }] });
    else if (type !== undefined && typeof (err as { status?: number }).status === 'number' && (err as { status: number }).status < 500) {
      error = new AppError('bad-request', (err as Error).message, (err as { status: number }).status);
    } else if (err instanceof UniqueConstraintError) error = new AppError('conflict', `already exists: ${err.errors.map((e) => e.path).join(', ')}`, 409);
    else {
      log(`unexpected error: ${(err as Error)?.stack ?? String(err)}`);
      error = new AppError('internal', 'internal error; the details are in the server log', 500);
    }
    const body: { code: string; message: string; fields?: unknown; details?: unknown } = { code: error.code, message: error.message };
    if (error.fields) body.fields = error.fields;
    if (error.details) body.details = error.details;
    if (res.headersSent) return;
    res.status(error.status).json({ error: body });
  };
}
