// Replies built from the API contract (shared/contract): the value's type comes from the reply's
// schema, and outside production the JSON about to be sent is checked against it, so a renamed
// or missing field fails the request (a 500 naming the field) instead of a page later.
import type { Response } from 'express';
import type { z } from 'zod';
import { checkContract, ContractError, type Sendable } from '../../shared/contract/check';
import { HttpError } from '../http-error';

/** The app setting that turns the check on (set in app.ts: on except in production). */
export const CHECK_REPLIES = 'check replies';

/** Send `value` as the JSON reply described by `schema`, with `status` (200 by default). */
export function reply<S extends z.ZodType>(res: Response, schema: S, value: Sendable<z.input<S>>, status = 200): void {
  if (res.app.get(CHECK_REPLIES)) {
    try {
      checkContract(schema, JSON.parse(JSON.stringify(value)), `The reply to ${res.req.method} ${res.req.originalUrl}`);
    } catch (err) {
      if (!(err instanceof ContractError)) throw err;
      console.error(err.message);
      throw new HttpError(500, 'reply_contract', err.message, err.issues);
    }
  }
  res.status(status).json(value);
}
