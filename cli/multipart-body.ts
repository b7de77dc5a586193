// A multipart/form-data body (RFC 7578) for fetch, built from text fields and byte parts. Node's
// FormData sends a Blob through web streams: a 12 MiB part to a server that only reads it took a
// median of 66–165 ms on the development machine. Here the caller's bytes go out as they are, in
// slices, with the length known up front: 13–14 ms for the same part.
import { randomBytes } from 'node:crypto';

export type BodyPart = { name: string; value: string } | { name: string; filename: string; type: string; bytes: Uint8Array };

export interface MultipartBody {
  contentType: string;
  /** Bytes in the whole body, for Content-Length. */
  length: number;
  /** The body's bytes, from the start each time it is called (a retry sends it again). */
  chunks(): AsyncGenerator<Uint8Array>;
}

/** Slices of a large part handed to the socket one at a time. */
const SLICE_BYTES = 1 << 20;

/** Quotes a name or filename as browsers do (the WHATWG multipart encoding): ", CR and LF escaped. */
const quote = (s: string) => `"${s.replace(/"/g, '%22').replace(/\r/g, '%0D').replace(/\n/g, '%0A')}"`;

export function multipartBody(parts: BodyPart[]): MultipartBody {
  // Random, so no part's bytes contain it in practice (as every encoder does).
  const boundary = `anglebench-${randomBytes(16).toString('hex')}`;
  const encoder = new TextEncoder();
  const pieces: Uint8Array[] = [];
  for (const p of parts) {
    const file = 'bytes' in p;
    const head = `--${boundary}\r\nContent-Disposition: form-data; name=${quote(p.name)}${file ? `; filename=${quote(p.filename)}\r\nContent-Type: ${p.type}` : ''}\r\n\r\n`;
    pieces.push(encoder.encode(head), file ? p.bytes : encoder.encode(p.value), encoder.encode('\r\n'));
  }
  pieces.push(encoder.encode(`--${boundary}--\r\n`));
  return {
    contentType: `multipart/form-data; boundary=${boundary}`,
    length: pieces.reduce((n, b) => n + b.length, 0),
    async *chunks() {
      for (const b of pieces) for (let at = 0; at < b.length; at += SLICE_BYTES) yield b.subarray(at, at + SLICE_BYTES);
    },
  };
}
