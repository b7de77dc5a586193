// The two multipart bodies of /api/sessions, read in memory: an upload (a `session` JSON field,
// `samples` and an optional `archive`) and an import (a `session` JSON field and one `file`).
import type { Request, RequestHandler } from 'express';
import multer from 'multer';
import type { z } from 'zod';
import { HttpError } from '../http-error';
import { memoryParts, type PartProgress } from './memory-parts';

/**
 * POST /api/sessions: one `session` field, `samples` and an optional `archive` (413 beyond the
 * limit); `onProgress` hears each chunk of the files as it lands.
 */
export function sessionUpload(limitBytes: number, onProgress?: PartProgress): RequestHandler {
  const upload = multer({ storage: memoryParts(limitBytes, onProgress), limits: { fileSize: limitBytes, files: 2, fields: 1, fieldSize: 1024 * 1024 } }).fields([
    { name: 'samples', maxCount: 1 },
    { name: 'archive', maxCount: 1 },
  ]);
  return (req, res, next) => upload(req, res, (err: unknown) => next(err ? uploadError(err, limitBytes) : undefined));
}

/** POST /api/sessions/import: one `session` field and one `file` (a recorder archive or a CSV). */
export function importUpload(limitBytes: number): RequestHandler {
  const upload = multer({ storage: memoryParts(limitBytes), limits: { fileSize: limitBytes, files: 1, fields: 1, fieldSize: 64 * 1024 } }).single('file');
  return (req, res, next) => upload(req, res, (err: unknown) => next(err ? uploadError(err, limitBytes) : undefined));
}

/** Multer's failures as the API's errors: 413 past a limit, 400 for a malformed body. */
function uploadError(err: unknown, limitBytes: number): unknown {
  if (err instanceof multer.MulterError) {
    if (err.code === 'LIMIT_FILE_SIZE') return new HttpError(413, 'too_large', `${err.field ?? 'A file'} is over the upload limit of ${limitBytes.toLocaleString('en-US')} bytes (UPLOAD_LIMIT_BYTES)`);
    if (err.code === 'LIMIT_FIELD_VALUE') return new HttpError(413, 'too_large', 'session: the JSON part is over its size limit');
    return new HttpError(400, 'bad_upload', `${err.field ? `${err.field}: ` : ''}${err.message}`);
  }
  return err instanceof Error && /multipart|unexpected end/i.test(err.message) ? new HttpError(400, 'bad_upload', err.message) : err;
}

/** The `session` JSON field parsed with `schema`. @throws HttpError 400 naming the first field at fault. */
export function readSessionPart<T extends z.ZodType>(req: Request, schema: T): z.output<T> {
  const raw = (req.body as Record<string, unknown> | undefined)?.session;
  if (typeof raw !== 'string') throw new HttpError(400, 'invalid', 'session: a multipart field named "session" holding JSON is required');
  let value: unknown;
  try {
    value = JSON.parse(raw);
  } catch {
    throw new HttpError(400, 'invalid', 'session: not valid JSON');
  }
  const r = schema.safeParse(value);
  if (!r.success) {
    const issues = r.error.issues.map((i) => ({ path: ['session', ...i.path].join('.'), message: i.message }));
    throw new HttpError(400, 'invalid', `${issues[0].path}: ${issues[0].message}`, issues);
  }
  return r.data;
}

/** The named file of a `.fields()` upload, if one was sent. */
export function uploadedFile(req: Request, name: string): Express.Multer.File | undefined {
  return ((req.files ?? {}) as Record<string, Express.Multer.File[] | undefined>)[name]?.[0];
}
