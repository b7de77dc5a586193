// Small schemas and helpers shared by the route files.
import type { Request } from 'express';
import { z } from 'zod';

// The id schemas are the API contract's.
export { id, idParams } from '../../shared/contract/common';

export const pageQuery = z.strictObject({
  limit: z.coerce.number().int().min(1).max(500).default(100),
  offset: z.coerce.number().int().min(0).default(0),
});

/** The address the caller reached us at, for links in e-mails (no public URL is configured). */
export const originOf = (req: Request) => `${req.protocol}://${req.get('host') ?? 'localhost'}`;

/** The parsed params of a request behind validate({ params }). */
export const paramsOf = <T>(req: Request) => req.params as unknown as T;
/** The parsed query of a request behind validate({ query }). */
export const queryOf = <T>(req: Request) => req.query as unknown as T;
