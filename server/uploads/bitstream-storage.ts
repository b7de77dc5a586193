import { createHash, randomUUID } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { Transform } from 'node:stream';
import { pipeline } from 'node:stream/promises';
import type { Request, RequestHandler } from 'express';
import multer from 'multer';
import { HttpError } from '../http-error';

/** What the storage engine adds to req.file. */
export interface HashedFile extends Express.Multer.File {
  sha256: string;
}

/**
 * A multer storage engine that streams the upload into a temporary file in `dir` while computing
 * its SHA-256, so a bitstream of any size is hashed without being held in memory. The caller
 * renames the temporary file into place once the database agrees; multer removes it on failure.
 */
const INCOMING = '.incoming-';

class HashingDiskStorage implements multer.StorageEngine {
  constructor(private readonly dir: string) {}

  _handleFile(_req: Request, file: Express.Multer.File, cb: (error?: unknown, info?: Partial<HashedFile>) => void): void {
    fs.mkdirSync(this.dir, { recursive: true });
    const tmp = path.join(this.dir, `${INCOMING}${randomUUID()}`);
    const hash = createHash('sha256');
    let size = 0;
    const hasher = new Transform({
      transform(chunk: Buffer, _enc, done) {
        hash.update(chunk);
        size += chunk.length;
        done(null, chunk);
      },
    });
    pipeline(file.stream, hasher, fs.createWriteStream(tmp, { flags: 'wx' })).then(
      () => cb(null, { path: tmp, size, sha256: hash.digest('hex') }),
      (err) => fs.rm(tmp, { force: true }, () => cb(err)),
    );
  }

  _removeFile(_req: Request, file: Express.Multer.File, cb: (error: Error | null) => void): void {
    fs.rm(file.path, { force: true }, (err) => cb(err));
  }
}

/**
 * Removes the temporary files of uploads a killed server never finished; run at start, before
 * the server takes uploads (one server owns its upload folder). Returns how many it removed.
 */
export function removeAbandonedUploads(dir: string): number {
  let names: string[];
  try {
    names = fs.readdirSync(dir);
  } catch {
    return 0; // no folder yet: nothing was ever uploaded
  }
  const abandoned = names.filter((n) => n.startsWith(INCOMING));
  for (const n of abandoned) fs.rmSync(path.join(dir, n), { force: true });
  return abandoned.length;
}

/**
 * Middleware taking one file in the multipart field `file`, at most `limitBytes` long (413
 * beyond), into `dir`. Multer's own errors become HttpErrors with a clear code.
 */
export function singleBitstream(dir: string, limitBytes: number): RequestHandler {
  const upload = multer({ storage: new HashingDiskStorage(dir), limits: { fileSize: limitBytes, files: 1, fields: 5 } }).single('file');
  return (req, res, next) =>
    upload(req, res, (err: unknown) => {
      if (!err) return next();
      if (err instanceof multer.MulterError) {
        if (err.code === 'LIMIT_FILE_SIZE') return next(new HttpError(413, 'too_large', `The file is over the upload limit of ${limitBytes} bytes`));
        return next(new HttpError(400, 'bad_upload', `${err.field ? `${err.field}: ` : ''}${err.message}`));
      }
      next(err instanceof Error && /multipart/i.test(err.message) ? new HttpError(400, 'bad_upload', err.message) : err);
    });
}

/**
 * A file name safe to store and to send back in Content-Disposition: the last path component
 * only (no `../`, no drive letters), printable ASCII from a small set, no leading dots.
 */
export function sanitizeFileName(name: string, fallback = 'bitstream.bin'): string {
  const base = name.split(/[\\/]/).pop() ?? '';
  const clean = base
    .replace(/[^A-Za-z0-9._+() -]/g, '_')
    .replace(/^[.\s]+/, '')
    .trim()
    .slice(0, 120);
  return clean || fallback;
}

/** Where a build's bitstream lives on disk: named by id, never by anything the client sent. */
export const bitstreamPath = (dir: string, buildId: number) => path.join(dir, `build-${buildId}.bit`);
