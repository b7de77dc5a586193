import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ForeignKeyConstraintError, UniqueConstraintError, ValidationError } from 'sequelize';
import type { ErrorReply } from '../../shared/contract/common';
import { HttpError } from '../http-error';

/** Unknown /api routes answer in the same JSON shape as every other error. */
export const apiNotFound: RequestHandler = (req, _res, next) =>
  next(new HttpError(404, 'not_found', `No API route for ${req.method} ${req.path}`));

interface BodyParserError extends Error {
  type?: string;
  status?: number;
  expose?: boolean;
}

/**
 * Every error leaves as `{ error: { code, message } }` with its status. Errors we did not raise
 * ourselves are logged and reported as a generic 500 so no stack or internals reach the client.
 */
export function errorHandler(log: (msg: string, err: unknown) => void = console.error): ErrorRequestHandler {
  return (err: unknown, _req, res, next) => {
    if (res.headersSent) return next(err);
    let status = 500;
    let code = 'internal';
    let message = 'Internal server error';
    let details: unknown;
    if (err instanceof HttpError) {
      ({ status, code, message, details } = err);
    } else if (err instanceof UniqueConstraintError) {
      // Checked before ValidationError, its base class.
      status = 409;
      code = 'conflict';
      message = `${err.errors.map((e) => e.path).filter(Boolean).join(', ') || 'value'}: already taken`;
    } else if (err instanceof ValidationError) {
      status = 400;
      code = 'invalid';
      message = err.errors.map((e) => `${e.path}: ${e.message}`).join('; ') || err.message;
    } else if (err instanceof ForeignKeyConstraintError) {
      status = 409;
      code = 'in_use';
      message = 'Other records refer to this one';
    } else if (isBodyParserError(err)) {
      // Raised by express.json() and friends: malformed JSON, too large, bad charset.
      status = err.status!;
      code = err.type === 'entity.too.large' ? 'too_large' : err.type === 'entity.parse.failed' ? 'bad_json' : 'bad_request';
      message = err.type === 'entity.parse.failed' ? 'The request body is not valid JSON' : err.message;
    } else {
      log('unhandled error', err);
    }
    // Typed from the contract but not sent through reply(): a failed check here would have no
    // error handler left to answer it.
    const body: ErrorReply = { error: details === undefined ? { code, message } : { code, message, details } };
    res.status(status).json(body);
  };
}

function isBodyParserError(err: unknown): err is BodyParserError {
  const e = err as BodyParserError;
  return e instanceof Error && typeof e.status === 'number' && e.status >= 400 && e.status < 500 && e.expose === true;
}
