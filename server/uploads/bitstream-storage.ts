import { createHash, randomUUID } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
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
/**
 * Whose upload a temporary file is: this host and process. Instances sharing one upload folder
 * (several servers on one PostgreSQL) must not remove each other's uploads in flight.
 */
const OWNER = `${os.hostname().replace(/[^A-Za-z0-9.]/g, '_')}-${process.pid}`;
const ABANDONED_AFTER_MS = 24 * 60 * 60 * 1000;

class HashingDiskStorage implements multer.StorageEngine {
  constructor(private readonly dir: string) {}

  _handleFile(_req: Request, file: Express.Multer.File, cb: (error?: unknown, info?: Partial<HashedFile>) => void): void {
    fs.mkdirSync(this.dir, { recursive: true });
    const tmp = path.join(this.dir, `${INCOMING}${OWNER}-${randomUUID()}`);
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
 * the server takes uploads. A file is abandoned when the process that wrote it (named in the file
 * name) is gone from this host, or — written elsewhere, or by an older version — when it is over
 * a day old. Returns how many it removed.
 */
export function removeAbandonedUploads(dir: string): number {
  let names: string[];
  try {
    names = fs.readdirSync(dir);
  } catch {
    return 0; // no folder yet: nothing was ever uploaded
  }
  const host = os.hostname().replace(/[^A-Za-z0-9.]/g, '_');
  const abandoned = names.filter((n) => {
    if (!n.startsWith(INCOMING)) return false;
    const owner = /^(.+)-(\d+)-[0-9a-f-]{36}$/.exec(n.slice(INCOMING.length));
    let lastWriteMs: number;
    try {
      lastWriteMs = fs.statSync(path.join(dir, n)).mtimeMs;
    } catch {
      return false; // finished and renamed meanwhile
    }
    if (owner && owner[1] === host && !writerAlive(Number(owner[2]), lastWriteMs)) return true;
    return Date.now() - lastWriteMs > ABANDONED_AFTER_MS;
  });
  for (const n of abandoned) fs.rmSync(path.join(dir, n), { force: true });
  return abandoned.length;
}

/**
 * Whether the process that wrote an upload may still be writing it. PIDs are reused (pid_max is
 * often 32,768, and a PostgreSQL server starts a process per connection), so a live PID counts
 * only if that process is no zombie and started before the file's last write (Linux's /proc; with
 * no /proc, a live PID counts).
 */
function writerAlive(pid: number, lastWriteMs: number): boolean {
  if (pid === process.pid) return true;
  try {
    process.kill(pid, 0);
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code !== 'EPERM') return false; // EPERM: alive, someone else's
  }
  const startedMs = processStartMs(pid);
  if (startedMs === 'zombie') return false;
  // Start times are known to about a second (boot time is given in whole seconds).
  return startedMs === null || startedMs <= lastWriteMs + 1500;
}

function processStartMs(pid: number): number | 'zombie' | null {
  try {
    const stat = fs.readFileSync(`/proc/${pid}/stat`, 'utf8');
    // After the command name in parentheses: state (field 3) … starttime (field 22), in clock ticks.
    const fields = stat.slice(stat.lastIndexOf(')') + 2).split(' ');
    if (fields[0] === 'Z' || fields[0] === 'X') return 'zombie';
    const bootS = Number(/^btime (\d+)$/m.exec(fs.readFileSync('/proc/stat', 'utf8'))?.[1]);
    const ticks = Number(fields[19]);
    if (!Number.isFinite(bootS) || !Number.isFinite(ticks)) return null;
    return bootS * 1000 + (ticks / 100) * 1000; // USER_HZ is 100 on Linux: common practice, no source
  } catch {
    return null;
  }
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
