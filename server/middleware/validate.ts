import type { RequestHandler } from 'express';
import type { z } from 'zod';
import { HttpError } from '../http-error';

interface Schemas {
  body?: z.ZodType;
  query?: z.ZodType;
  params?: z.ZodType;
}

/**
 * Check the request against zod schemas (use z.strictObject so unknown fields are refused) and
 * replace each part with its parsed value. A failure is a 400 whose message names the first
 * field at fault and whose details list every issue.
 */
export function validate(schemas: Schemas): RequestHandler {
  return (req, _res, next) => {
    const issues: Array<{ path: string; message: string }> = [];
    for (const part of ['params', 'query', 'body'] as const) {
      const schema = schemas[part];
      if (!schema) continue;
      const result = schema.safeParse(req[part] ?? {});
      if (!result.success) {
        for (const issue of result.error.issues) issues.push({ path: [part, ...issue.path].join('.'), message: issue.message });
        continue;
      }
      // Express 5 makes req.query a getter; define it over so handlers see the parsed value.
      if (part === 'query') Object.defineProperty(req, 'query', { value: result.data, writable: true, configurable: true });
      else req[part] = result.data;
    }
    if (issues.length) return next(new HttpError(400, 'invalid', `${issues[0].path}: ${issues[0].message}`, issues));
    next();
  };
}
