// Small schemas and helpers shared by the route files.
import type { Request } from 'express';
import { z } from 'zod';

// The id schemas are the API contract's.
export { id, idParams } from '../../shared/contract/common';

export const pageQuery = z.strictObject({
  limit: z.coerce.number().int().min(1).max(500).default(100),
  offset: z.coerce.number().int().min(0).default(0),
});

/** Where links in e-mail point: PUBLIC_URL when set, else the address this request came to. */
export const originOf = (req: Request): string =>
  (req.app.get('public url') as string | undefined) ?? `${req.protocol}://${req.get('host') ?? 'localhost'}`;

/** The parsed params of a request behind validate({ params }). */
export const paramsOf = <T>(req: Request) => req.params as unknown as T;
/** The parsed query of a request behind validate({ query }). */
export const queryOf = <T>(req: Request) => req.query as unknown as T;
