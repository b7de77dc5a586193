// The stored and uploaded sample format: one 12-byte record per answered result — angle code,
// cos code, sin code, each a little-endian int32 — in request order. Binary (`turn`) angle codes
// are unsigned, so 32-bit codes above 2^31 are read back with their bits kept.

export const SAMPLE_BYTES = 12;

export class SamplePackError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'SamplePackError';
  }
}

/** Pack the answered results (`answered[i]` non-zero) of a run. */
export function packSamples(codes: ArrayLike<number>, cos: ArrayLike<number>, sin: ArrayLike<number>, answered: ArrayLike<number>): Uint8Array<ArrayBuffer> {
  const out = new Uint8Array(answeredCount(answered) * SAMPLE_BYTES);
  const view = new DataView(out.buffer);
  let at = 0;
  for (let i = 0; i < codes.length; i++) {
    if (!answered[i]) continue;
    view.setInt32(at, codes[i] | 0, true);
    view.setInt32(at + 4, cos[i], true);
    view.setInt32(at + 8, sin[i], true);
    at += SAMPLE_BYTES;
  }
  return out;
}

/** Pack every sample of unpacked columns (the inverse of unpackSamples). */
export function packColumns(s: UnpackedSamples): Uint8Array<ArrayBuffer> {
  return packSamples(s.codes, s.cos, s.sin, new Uint8Array(s.codes.length).fill(1));
}

/** How many results were answered. */
export function answeredCount(answered: ArrayLike<number>): number {
  let n = 0;
  for (let i = 0; i < answered.length; i++) if (answered[i]) n++;
  return n;
}

export interface UnpackedSamples {
  codes: Float64Array;
  cos: Int32Array;
  sin: Int32Array;
}

/** Unpack samples. @throws SamplePackError when the length is not a whole number of records. */
export function unpackSamples(bytes: Uint8Array, angleFormat: 'turn' | 'rad'): UnpackedSamples {
  if (bytes.length % SAMPLE_BYTES !== 0) {
    throw new SamplePackError(`${bytes.length} bytes is not a whole number of ${SAMPLE_BYTES}-byte samples (truncated?)`);
  }
  const n = bytes.length / SAMPLE_BYTES;
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const out: UnpackedSamples = { codes: new Float64Array(n), cos: new Int32Array(n), sin: new Int32Array(n) };
  for (let i = 0, at = 0; i < n; i++, at += SAMPLE_BYTES) {
    out.codes[i] = angleFormat === 'turn' ? view.getUint32(at, true) : view.getInt32(at, true);
    out.cos[i] = view.getInt32(at + 4, true);
    out.sin[i] = view.getInt32(at + 8, true);
  }
  return out;
}
