import { Readable } from 'node:stream';
import type { Request } from 'express';
import { describe, expect, it } from 'vitest';
import { memoryParts } from '../../../../server/uploads/memory-parts';

/** The storage engine fed `chunks` as multer feeds it, under a request of `contentLength` (none: chunked). */
function store(chunks: Buffer[], contentLength: number | undefined, limit = 1 << 20): Promise<{ buffer: Buffer; size: number }> {
  const req = { headers: contentLength === undefined ? {} : { 'content-length': String(contentLength) } } as unknown as Request;
  const file = { stream: Readable.from(chunks) } as unknown as Express.Multer.File;
  return new Promise((resolve, reject) => memoryParts(limit)._handleFile(req, file, (err, info) => (err ? reject(err) : resolve(info as { buffer: Buffer; size: number }))));
}

const chunks = Array.from({ length: 40 }, (_, k) => Buffer.alloc(1000 + k, k));
const whole = Buffer.concat(chunks);

describe('memoryParts', () => {
  it('keeps a file whose request declares its length, byte for byte', async () => {
    const got = await store(chunks, whole.length + 200);
    expect(got.size).toBe(whole.length);
    expect(got.buffer.equals(whole)).toBe(true);
  });

  it('keeps a file of a chunked request (no length), growing as it goes', async () => {
    const got = await store(chunks, undefined);
    expect(got.buffer.equals(whole)).toBe(true);
  });

  it('copies a small file out of a large body rather than keeping the whole allocation', async () => {
    const got = await store(chunks.slice(0, 2), 1 << 20);
    expect(got.buffer.equals(Buffer.concat(chunks.slice(0, 2)))).toBe(true);
    expect(got.buffer.buffer.byteLength).toBeLessThan(1 << 20);
  });

  it('grows past a Content-Length that understated the body', async () => {
    const got = await store(chunks, 100);
    expect(got.buffer.equals(whole)).toBe(true);
  });
});
