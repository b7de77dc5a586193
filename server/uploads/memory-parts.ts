// A multer storage engine that keeps each file in one Buffer, sized from the request's
// Content-Length up front: multer's memory storage keeps every chunk and concatenates them at
// the end, so a large upload briefly needs twice its size. Files end up as multer's memory
// storage leaves them (`file.buffer`, `file.size`), so handlers cannot tell the two apart.
import type { Request } from 'express';
import type { StorageEngine } from 'multer';

/** Told after each chunk of a file: its first `size` bytes are in `bytes` (a buffer that may be replaced as it grows). */
export type PartProgress = (req: Request, field: string, bytes: Buffer, size: number) => void;

/** Files in memory, each at most `limitBytes` (multer's own fileSize limit refuses beyond). */
export function memoryParts(limitBytes: number, onProgress?: PartProgress): StorageEngine {
  return {
    _handleFile(req: Request, file, cb) {
      const declared = Number(req.headers['content-length']);
      // The whole body bounds any one file; without a length (chunked), start small and grow.
      let buf = Buffer.allocUnsafeSlow(Number.isSafeInteger(declared) && declared > 0 ? Math.min(declared, limitBytes + 1) : 64 * 1024);
      let size = 0;
      file.stream.on('data', (chunk: Buffer) => {
        if (size + chunk.length > buf.length) {
          const grown = Buffer.allocUnsafeSlow(Math.max(size + chunk.length, Math.min(buf.length * 2, limitBytes + 1)));
          buf.copy(grown, 0, 0, size);
          buf = grown;
        }
        chunk.copy(buf, size);
        size += chunk.length;
        onProgress?.(req, file.fieldname, buf, size);
      });
      file.stream.on('error', (err: Error) => cb(err));
      file.stream.on('end', () => {
        // A file much smaller than the body (a small samples part beside a large archive) is
        // copied out, so the rest of the allocation is not kept alive with it.
        const buffer = size * 4 >= buf.length * 3 ? buf.subarray(0, size) : Buffer.from(buf.subarray(0, size));
        buf = Buffer.alloc(0);
        cb(null, { buffer, size });
      });
    },
    _removeFile(_req, file, cb) {
      delete (file as Partial<Express.Multer.File>).buffer;
      cb(null);
    },
  };
}
