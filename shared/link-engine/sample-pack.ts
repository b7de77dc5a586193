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

/** Whether typed arrays on this platform read little-endian, as the packed format is. */
const LITTLE_ENDIAN = new Uint8Array(new Uint32Array([1]).buffer)[0] === 1;

/** Unpack samples. @throws SamplePackError when the length is not a whole number of records. */
export function unpackSamples(bytes: Uint8Array, angleFormat: 'turn' | 'rad'): UnpackedSamples {
  const n = sampleCountOf(bytes);
  const out: UnpackedSamples = { codes: new Float64Array(n), cos: new Int32Array(n), sin: new Int32Array(n) };
  unpackSamplesInto(bytes, angleFormat, 0, n, out);
  return out;
}

/** How many samples `bytes` holds. @throws SamplePackError when the length is not a whole number of records. */
export function sampleCountOf(bytes: Uint8Array): number {
  if (bytes.length % SAMPLE_BYTES !== 0) {
    throw new SamplePackError(`${bytes.length} bytes is not a whole number of ${SAMPLE_BYTES}-byte samples (truncated?)`);
  }
  return bytes.length / SAMPLE_BYTES;
}

/**
 * Unpack `count` samples from sample `first` on into the start of `out`'s columns (each at least
 * `count` long): batch by batch, a caller never holds every sample unpacked at once.
 */
export function unpackSamplesInto(bytes: Uint8Array, angleFormat: 'turn' | 'rad', first: number, count: number, out: UnpackedSamples): void {
  const at0 = first * SAMPLE_BYTES;
  const { codes, cos, sin } = out;
  // The common case reads the words in place (a 4-byte-aligned buffer on a little-endian
  // machine): several times faster than DataView calls per field, the same values.
  if (LITTLE_ENDIAN && (bytes.byteOffset + at0) % 4 === 0) {
    const words = new Int32Array(bytes.buffer, bytes.byteOffset + at0, count * 3);
    if (angleFormat === 'turn') {
      for (let i = 0, w = 0; i < count; i++, w += 3) {
        codes[i] = words[w] >>> 0;
        cos[i] = words[w + 1];
        sin[i] = words[w + 2];
      }
    } else {
      for (let i = 0, w = 0; i < count; i++, w += 3) {
        codes[i] = words[w];
        cos[i] = words[w + 1];
        sin[i] = words[w + 2];
      }
    }
    return;
  }
  const view = new DataView(bytes.buffer, bytes.byteOffset + at0, count * SAMPLE_BYTES);
  for (let i = 0, at = 0; i < count; i++, at += SAMPLE_BYTES) {
    codes[i] = angleFormat === 'turn' ? view.getUint32(at, true) : view.getInt32(at, true);
    cos[i] = view.getInt32(at + 4, true);
    sin[i] = view.getInt32(at + 8, true);
  }
}
