// The stored and uploaded sample format of a vectoring core: one 16-byte record per answered
// vector — x code, y code, angle code, magnitude code, each a little-endian int32 — in request
// order. Every field is signed: vectoring angle codes have at most 31 bits (shared/vectoring), so a
// binary angle code is a non-negative int32.
import { SamplePackError } from './sample-pack';

export const VECTOR_SAMPLE_BYTES = 16;

/** A vectoring session's answers as columns. */
export interface VectorSamples {
  xs: Int32Array;
  ys: Int32Array;
  angles: Int32Array;
  magnitudes: Int32Array;
}

/** Pack the answered vectors (`answered[i]` non-zero; every one when left out) of a run. */
export function packVectorSamples(s: { xs: ArrayLike<number>; ys: ArrayLike<number>; angles: ArrayLike<number>; magnitudes: ArrayLike<number> }, answered?: ArrayLike<number>): Uint8Array<ArrayBuffer> {
  const n = s.xs.length;
  let count = n;
  if (answered) {
    count = 0;
    for (let i = 0; i < n; i++) if (answered[i]) count++;
  }
  const out = new Uint8Array(count * VECTOR_SAMPLE_BYTES);
  const view = new DataView(out.buffer);
  for (let i = 0, at = 0; i < n; i++) {
    if (answered && !answered[i]) continue;
    view.setInt32(at, s.xs[i], true);
    view.setInt32(at + 4, s.ys[i], true);
    view.setInt32(at + 8, s.angles[i], true);
    view.setInt32(at + 12, s.magnitudes[i], true);
    at += VECTOR_SAMPLE_BYTES;
  }
  return out;
}

/** Unpack vectoring samples. @throws SamplePackError when the length is not a whole number of records. */
export function unpackVectorSamples(bytes: Uint8Array): VectorSamples {
  if (bytes.length % VECTOR_SAMPLE_BYTES !== 0) {
    throw new SamplePackError(`${bytes.length} bytes is not a whole number of ${VECTOR_SAMPLE_BYTES}-byte vectoring samples (truncated, or samples of a rotation core?)`);
  }
  const n = bytes.length / VECTOR_SAMPLE_BYTES;
  const view = new DataView(bytes.buffer, bytes.byteOffset, bytes.byteLength);
  const out: VectorSamples = { xs: new Int32Array(n), ys: new Int32Array(n), angles: new Int32Array(n), magnitudes: new Int32Array(n) };
  for (let i = 0, at = 0; i < n; i++, at += VECTOR_SAMPLE_BYTES) {
    out.xs[i] = view.getInt32(at, true);
    out.ys[i] = view.getInt32(at + 4, true);
    out.angles[i] = view.getInt32(at + 8, true);
    out.magnitudes[i] = view.getInt32(at + 12, true);
  }
  return out;
}
