// Frame layout (docs/protocol.md "2. Frame"):
//   offset 0      SYNC   0xA5
//   offset 1      KIND
//   offset 2      TAG    0..255, echoed by replies
//   offset 3      LEN    payload bytes, 0..255
//   offset 4      PAYLOAD (LEN bytes)
//   offset 4+LEN  CHECK  CRC-8 over bytes 1 .. 3+LEN (KIND, TAG, LEN, PAYLOAD; not SYNC)
import { crc8, DEFAULT_CRC8, type Crc8Name } from './crc8';
import { MAX_PAYLOAD } from './wire-profile';

/** First byte of every frame. */
export const SYNC = 0xa5;
/** Bytes a frame adds around its payload: SYNC, KIND, TAG, LEN, CHECK. */
export const FRAME_OVERHEAD = 5;
/** Bytes before the payload. */
export const HEADER_BYTES = 4;

/** Raised when a frame cannot be built (field out of range); the message names the field. */
export class FrameError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'FrameError';
  }
}

function checkByte(field: string, v: number): void {
  if (!Number.isInteger(v) || v < 0 || v > 0xff) throw new FrameError(`${field} must be a byte 0..255, got ${v}`);
}

/** Total bytes on the wire for a frame with `payloadBytes` of payload. */
export function frameLength(payloadBytes: number): number {
  return payloadBytes + FRAME_OVERHEAD;
}

/**
 * Writes one frame into `out` at `offset` and returns the number of bytes written, so a sender
 * can pack many frames into one buffer without intermediate arrays.
 */
export function encodeFrameInto(
  out: Uint8Array,
  offset: number,
  kind: number,
  tag: number,
  payload: Uint8Array,
  crcName: Crc8Name = DEFAULT_CRC8,
): number {
  checkByte('kind', kind);
  checkByte('tag', tag);
  if (payload.length > MAX_PAYLOAD) throw new FrameError(`payload must be at most ${MAX_PAYLOAD} bytes, got ${payload.length}`);
  const total = frameLength(payload.length);
  if (offset < 0 || offset + total > out.length) throw new FrameError(`out has no room for a ${total}-byte frame at offset ${offset}`);
  out[offset] = SYNC;
  out[offset + 1] = kind;
  out[offset + 2] = tag;
  out[offset + 3] = payload.length;
  out.set(payload, offset + HEADER_BYTES);
  const end = offset + HEADER_BYTES + payload.length;
  out[end] = crc8(crcName).compute(out, offset + 1, end);
  return total;
}

/** Builds one complete frame: SYNC, KIND, TAG, LEN, PAYLOAD, CHECK. */
export function encodeFrame(kind: number, tag: number, payload: Uint8Array = new Uint8Array(0), crcName: Crc8Name = DEFAULT_CRC8): Uint8Array {
  const out = new Uint8Array(frameLength(payload.length));
  encodeFrameInto(out, 0, kind, tag, payload, crcName);
  return out;
}
