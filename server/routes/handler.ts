// A route handler typed from its zod schemas: the request is checked first (validate), then the
// handler receives the parsed params, query and body with the types the schemas give them.
import type { Request, RequestHandler, Response } from 'express';
import type { z } from 'zod';
import { validate } from '../middleware/validate';

interface Schemas {
  params?: z.ZodType;
  query?: z.ZodType;
  body?: z.ZodType;
}
type Parsed<S> = S extends z.ZodType ? z.output<S> : undefined;

export interface Input<S extends Schemas> {
  params: Parsed<S['params']>;
  query: Parsed<S['query']>;
  body: Parsed<S['body']>;
}

/** `router.get(path, guard, ...handler({ params: idParams }, async ({ params }, req, res) => …))`. */
export function handler<S extends Schemas>(
  schemas: S,
  fn: (input: Input<S>, req: Request, res: Response) => Promise<unknown> | unknown,
): [RequestHandler, RequestHandler] {
  return [
    validate(schemas),
    async (req, res) => {
      const input = {
        params: schemas.params ? req.params : undefined,
        query: schemas.query ? req.query : undefined,
        body: schemas.body ? req.body : undefined,
      } as Input<S>;
      await fn(input, req, res);
    },
  ];
}
