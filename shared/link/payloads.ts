// Payload codecs for every KIND (docs/protocol.md "Host → board", "Board → host"). All fields are
// little-endian. Angle fields are ceil(angleBits/8) bytes (unsigned for `turn`, two's complement
// for `rad`); output fields are ceil(outBits/8) bytes, two's complement.
import { DEFAULT_CRC8, type Crc8Name } from './crc8';
import { encodeFrame } from './frame';
import { isKnownKind, Kind, kindName } from './kinds';
import {
  angleBytes,
  angleCodeRange,
  INFO_FIXED_BYTES,
  inputBytes,
  isPossibleLength,
  MAX_PAYLOAD,
  maxListCodes,
  maxResultPairs,
  maxVectorListPairs,
  maxVectorResultPairs,
  MODE_INFO_FIXED_BYTES,
  outBytes,
  RESULTS_HEADER_BYTES,
  VEC_GRID_BYTES,
  validateVectorProfile,
  vectorProfile,
  type VectorWireProfile,
  type WireProfile,
} from './wire-profile';

/** What a device tells about itself in INFO. */
export interface DeviceInfo {
  version: number;
  angleFormat: 'turn' | 'rad';
  angleBits: number;
  angleFrac: number;
  outBits: number;
  outFrac: number;
  iterations: number;
  queueDepth: number;
  buildId: number;
  clockKHz: number;
  /** ASCII, at most 238 characters (the rest of a 255-byte payload). */
  name: string;
}

/**
 * What a version-2 device tells in MODE_INFO: which modes it serves and, when it vectors, the
 * vectoring core's formats (docs/protocol.md section 8).
 */
export interface ModeInfo {
  rotation: boolean;
  /** The vectoring core's formats, or null when the device does not vector. */
  vectoring: VectoringFormats | null;
}

/** The formats and iteration count of a vectoring core, as MODE_INFO carries them. */
export interface VectoringFormats {
  inBits: number;
  inFrac: number;
  angleFormat: 'turn' | 'rad';
  angleBits: number;
  angleFrac: number;
  magBits: number;
  magFrac: number;
  iterations: number;
}

/** A VEC_GRID request: x0 + i·dx for i < nx, y0 + j·dy for j < ny; point i·ny + j (y fastest). */
export interface VectorGrid {
  x0: number;
  dx: number;
  nx: number;
  y0: number;
  dy: number;
  ny: number;
}

/** The MODE_INFO mode bits. */
export const ModeBit = { Rotation: 1, Vectoring: 2 } as const;

/** One decoded message; `kind` tells which. */
export type Message =
  | { kind: typeof Kind.Hello | typeof Kind.Modes | typeof Kind.Pause | typeof Kind.Resume | typeof Kind.Abort }
  | { kind: typeof Kind.VecOne; x: number; y: number }
  | { kind: typeof Kind.VecList; xs: number[]; ys: number[] }
  | ({ kind: typeof Kind.VecGrid } & VectorGrid)
  | { kind: typeof Kind.ModeInfo; modes: ModeInfo }
  | { kind: typeof Kind.VecResults; firstIndex: number; angle: Int32Array; magnitude: Int32Array }
  | { kind: typeof Kind.One; angleCode: number }
  | { kind: typeof Kind.List; angleCodes: number[] }
  | { kind: typeof Kind.Sweep; start: number; step: number; count: number }
  | { kind: typeof Kind.Info; info: DeviceInfo }
  | { kind: typeof Kind.Results; firstIndex: number; cos: Int32Array; sin: Int32Array }
  | { kind: typeof Kind.SweepEnd; done: number; status: number }
  | { kind: typeof Kind.Ack; acked: number }
  | { kind: typeof Kind.Nak; refused: number; reason: number };

/** The message type for one KIND, e.g. `MessageOf<typeof Kind.Results>`. */
export type MessageOf<K extends Message['kind']> = Extract<Message, { kind: K }>;

/** Raised when a payload cannot be encoded or decoded; the message names the field. */
export class PayloadError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'PayloadError';
  }
}

const INFO_FORMATS = ['turn', 'rad'] as const;

// Field limits by width in bytes (1..4), signed and unsigned: put() checks every field, so not
// recomputed per call.
const FIELD_MIN = [0, -(2 ** 7), -(2 ** 15), -(2 ** 23), -(2 ** 31)];
const FIELD_MAX_SIGNED = [0, 2 ** 7 - 1, 2 ** 15 - 1, 2 ** 23 - 1, 2 ** 31 - 1];
const FIELD_MAX_UNSIGNED = [0, 2 ** 8 - 1, 2 ** 16 - 1, 2 ** 24 - 1, 2 ** 32 - 1];

function put(out: Uint8Array, at: number, width: number, value: number, signed: boolean, field: string): void {
  if (width <= 4) {
    const min = signed ? FIELD_MIN[width] : 0;
    const max = signed ? FIELD_MAX_SIGNED[width] : FIELD_MAX_UNSIGNED[width];
    if (!Number.isInteger(value) || value < min || value > max) {
      throw new PayloadError(`${field} must be an integer ${min}..${max} for a ${width}-byte field, got ${value}`);
    }
    // Within those limits the low bytes of the 32-bit pattern are the field, either sign.
    for (let i = 0; i < width; i++) out[at + i] = (value >>> (8 * i)) & 0xff;
    return;
  }
  const bits = 8 * width;
  const min = signed ? -(2 ** (bits - 1)) : 0;
  const max = signed ? 2 ** (bits - 1) - 1 : 2 ** bits - 1;
  if (!Number.isInteger(value) || value < min || value > max) {
    throw new PayloadError(`${field} must be an integer ${min}..${max} for a ${width}-byte field, got ${value}`);
  }
  let v = value < 0 ? value + 2 ** bits : value;
  for (let i = 0; i < width; i++) {
    out[at + i] = v & 0xff;
    v = Math.floor(v / 256);
  }
}

function get(src: Uint8Array, at: number, width: number, signed: boolean): number {
  // 16- and 32-bit fields (every RESULTS pair of the default core) in integer arithmetic: the
  // general loop's powers of two cost more than decoding and scoring the rest of a result.
  if (width === 2) {
    const v = src[at] | (src[at + 1] << 8);
    return signed ? (v << 16) >> 16 : v;
  }
  if (width === 4) {
    const v = src[at] | (src[at + 1] << 8) | (src[at + 2] << 16) | (src[at + 3] << 24);
    return signed ? v : v >>> 0;
  }
  // 3 bytes: the default vectoring core's 18-bit magnitudes.
  if (width === 3) {
    const v = src[at] | (src[at + 1] << 8) | (src[at + 2] << 16);
    return signed ? (v << 8) >> 8 : v;
  }
  let v = 0;
  for (let i = width - 1; i >= 0; i--) v = v * 256 + src[at + i];
  const bits = 8 * width;
  return signed && v >= 2 ** (bits - 1) ? v - 2 ** bits : v;
}

/** Builds the payload of `m` under profile `p`. */
export function encodePayload(m: Message, p: WireProfile): Uint8Array {
  const aw = angleBytes(p);
  const signedAngle = p.angleFormat === 'rad';
  switch (m.kind) {
    case Kind.Hello:
    case Kind.Modes:
    case Kind.Pause:
    case Kind.Resume:
    case Kind.Abort:
      return new Uint8Array(0);
    case Kind.VecOne: {
      const iw = inputBytes(p);
      const out = new Uint8Array(2 * iw);
      put(out, 0, iw, m.x, true, 'x');
      put(out, iw, iw, m.y, true, 'y');
      return out;
    }
    case Kind.VecList: {
      const iw = inputBytes(p);
      const k = m.xs.length;
      if (m.ys.length !== k) throw new PayloadError(`xs and ys must be the same length, got ${k} and ${m.ys.length}`);
      if (k < 1 || k > maxVectorListPairs(p)) throw new PayloadError(`a VEC_LIST carries 1..${maxVectorListPairs(p)} vectors, got ${k}`);
      const out = new Uint8Array(2 * iw * k);
      for (let i = 0, at = 0; i < k; i++, at += 2 * iw) {
        put(out, at, iw, m.xs[i], true, `xs[${i}]`);
        put(out, at + iw, iw, m.ys[i], true, `ys[${i}]`);
      }
      return out;
    }
    case Kind.VecGrid: {
      const out = new Uint8Array(VEC_GRID_BYTES);
      put(out, 0, 4, m.x0, true, 'x0');
      put(out, 4, 4, m.dx, true, 'dx');
      put(out, 8, 4, m.y0, true, 'y0');
      put(out, 12, 4, m.dy, true, 'dy');
      put(out, 16, 2, m.nx, false, 'nx');
      put(out, 18, 2, m.ny, false, 'ny');
      return out;
    }
    case Kind.ModeInfo: {
      const out = new Uint8Array(MODE_INFO_FIXED_BYTES);
      const v = m.modes.vectoring;
      out[0] = (m.modes.rotation ? ModeBit.Rotation : 0) | (v ? ModeBit.Vectoring : 0);
      if (v) {
        const format = INFO_FORMATS.indexOf(v.angleFormat);
        if (format < 0) throw new PayloadError(`angleFormat must be "turn" or "rad", got ${JSON.stringify(v.angleFormat)}`);
        put(out, 1, 1, v.inBits, false, 'inBits');
        put(out, 2, 1, v.inFrac, false, 'inFrac');
        put(out, 3, 1, format, false, 'angleFormat');
        put(out, 4, 1, v.angleBits, false, 'angleBits');
        put(out, 5, 1, v.angleFrac, false, 'angleFrac');
        put(out, 6, 1, v.magBits, false, 'magBits');
        put(out, 7, 1, v.magFrac, false, 'magFrac');
        put(out, 8, 1, v.iterations, false, 'iterations');
      }
      return out;
    }
    case Kind.VecResults: {
      const n = m.angle.length;
      const v = vectorProfile(p);
      const aw = Math.ceil(v.angleBits / 8);
      const mw = Math.ceil(v.magBits / 8);
      if (m.magnitude.length !== n) throw new PayloadError(`angle and magnitude must be the same length, got ${n} and ${m.magnitude.length}`);
      if (n < 1 || n > maxVectorResultPairs(p)) throw new PayloadError(`a VEC_RESULTS frame carries 1..${maxVectorResultPairs(p)} pairs, got ${n}`);
      const out = new Uint8Array(RESULTS_HEADER_BYTES + (aw + mw) * n);
      put(out, 0, 4, m.firstIndex, false, 'firstIndex');
      const signedOut = v.angleFormat === 'rad';
      for (let i = 0, at = RESULTS_HEADER_BYTES; i < n; i++, at += aw + mw) {
        put(out, at, aw, m.angle[i], signedOut, `angle[${i}]`);
        put(out, at + aw, mw, m.magnitude[i], true, `magnitude[${i}]`);
      }
      return out;
    }
    case Kind.One: {
      const out = new Uint8Array(aw);
      put(out, 0, aw, m.angleCode, signedAngle, 'angleCode');
      return out;
    }
    case Kind.List: {
      const k = m.angleCodes.length;
      if (k < 1 || k > maxListCodes(p)) throw new PayloadError(`angleCodes must hold 1..${maxListCodes(p)} codes, got ${k}`);
      const out = new Uint8Array(k * aw);
      for (let i = 0; i < k; i++) put(out, i * aw, aw, m.angleCodes[i], signedAngle, `angleCodes[${i}]`);
      return out;
    }
    case Kind.Sweep: {
      const out = new Uint8Array(12);
      put(out, 0, 4, m.start, signedAngle, 'start');
      put(out, 4, 4, m.step, true, 'step');
      put(out, 8, 4, m.count, false, 'count');
      return out;
    }
    case Kind.Info: {
      const i = m.info;
      const name = i.name;
      if (!/^[\x20-\x7e]*$/.test(name)) throw new PayloadError('name must be printable ASCII');
      if (INFO_FIXED_BYTES + name.length > MAX_PAYLOAD) throw new PayloadError(`name must be at most ${MAX_PAYLOAD - INFO_FIXED_BYTES} characters`);
      const out = new Uint8Array(INFO_FIXED_BYTES + name.length);
      const format = INFO_FORMATS.indexOf(i.angleFormat);
      if (format < 0) throw new PayloadError(`angleFormat must be "turn" or "rad", got ${JSON.stringify(i.angleFormat)}`);
      put(out, 0, 1, i.version, false, 'version');
      put(out, 1, 1, format, false, 'angleFormat');
      put(out, 2, 1, i.angleBits, false, 'angleBits');
      put(out, 3, 1, i.angleFrac, false, 'angleFrac');
      put(out, 4, 1, i.outBits, false, 'outBits');
      put(out, 5, 1, i.outFrac, false, 'outFrac');
      put(out, 6, 1, i.iterations, false, 'iterations');
      put(out, 7, 2, i.queueDepth, false, 'queueDepth');
      put(out, 9, 4, i.buildId, false, 'buildId');
      put(out, 13, 4, i.clockKHz, false, 'clockKHz');
      for (let c = 0; c < name.length; c++) out[INFO_FIXED_BYTES + c] = name.charCodeAt(c);
      return out;
    }
    case Kind.Results: {
      const n = m.cos.length;
      const ow = outBytes(p);
      if (m.sin.length !== n) throw new PayloadError(`cos and sin must be the same length, got ${n} and ${m.sin.length}`);
      if (n < 1 || n > maxResultPairs(p)) throw new PayloadError(`a RESULTS frame carries 1..${maxResultPairs(p)} pairs, got ${n}`);
      const out = new Uint8Array(RESULTS_HEADER_BYTES + 2 * ow * n);
      put(out, 0, 4, m.firstIndex, false, 'firstIndex');
      for (let i = 0, at = RESULTS_HEADER_BYTES; i < n; i++, at += 2 * ow) {
        put(out, at, ow, m.cos[i], true, `cos[${i}]`);
        put(out, at + ow, ow, m.sin[i], true, `sin[${i}]`);
      }
      return out;
    }
    case Kind.SweepEnd: {
      const out = new Uint8Array(5);
      put(out, 0, 4, m.done, false, 'done');
      put(out, 4, 1, m.status, false, 'status');
      return out;
    }
    case Kind.Ack:
      return Uint8Array.of(byteField('acked', m.acked));
    case Kind.Nak:
      return Uint8Array.of(byteField('refused', m.refused), byteField('reason', m.reason));
    default:
      throw new PayloadError(`kind ${kindName((m as { kind: number }).kind)} has no payload codec`);
  }
}

function byteField(field: string, v: number): number {
  const out = new Uint8Array(1);
  put(out, 0, 1, v, false, field);
  return out[0];
}

/** Reads the payload of a frame of `kind` under profile `p`; throws PayloadError if impossible. */
export function decodePayload(kind: number, payload: Uint8Array, p: WireProfile): Message {
  if (!isKnownKind(kind)) throw new PayloadError(`unknown KIND ${kindName(kind)}`);
  if (!isPossibleLength(kind, payload.length, p)) throw new PayloadError(`LEN ${payload.length} is impossible for ${kindName(kind)}`);
  const aw = angleBytes(p);
  const signedAngle = p.angleFormat === 'rad';
  const b = payload;
  switch (kind) {
    case Kind.Hello:
    case Kind.Modes:
    case Kind.Pause:
    case Kind.Resume:
    case Kind.Abort:
      return { kind };
    case Kind.VecOne: {
      const iw = inputBytes(p);
      return { kind, x: get(b, 0, iw, true), y: get(b, iw, iw, true) };
    }
    case Kind.VecList: {
      const iw = inputBytes(p);
      const k = b.length / (2 * iw);
      const xs: number[] = new Array(k);
      const ys: number[] = new Array(k);
      for (let i = 0, at = 0; i < k; i++, at += 2 * iw) {
        xs[i] = get(b, at, iw, true);
        ys[i] = get(b, at + iw, iw, true);
      }
      return { kind, xs, ys };
    }
    case Kind.VecGrid:
      return { kind, x0: get(b, 0, 4, true), dx: get(b, 4, 4, true), y0: get(b, 8, 4, true), dy: get(b, 12, 4, true), nx: get(b, 16, 2, false), ny: get(b, 18, 2, false) };
    case Kind.ModeInfo: {
      // Bytes past the fixed fields belong to later versions: skipped.
      if ((b[0] & ModeBit.Vectoring) === 0) return { kind, modes: { rotation: (b[0] & ModeBit.Rotation) !== 0, vectoring: null } };
      const angleFormat = INFO_FORMATS[b[3]];
      if (!angleFormat) throw new PayloadError(`MODE_INFO angleFormat code ${b[3]} is neither 0 (turn) nor 1 (rad)`);
      const vectoring: VectoringFormats = { inBits: b[1], inFrac: b[2], angleFormat, angleBits: b[4], angleFrac: b[5], magBits: b[6], magFrac: b[7], iterations: b[8] };
      try {
        validateVectorProfile(vectorWireProfile(vectoring));
      } catch (e) {
        throw new PayloadError(`MODE_INFO: ${(e as Error).message}`);
      }
      return { kind, modes: { rotation: (b[0] & ModeBit.Rotation) !== 0, vectoring } };
    }
    case Kind.VecResults: {
      const v = vectorProfile(p);
      const aw = Math.ceil(v.angleBits / 8);
      const mw = Math.ceil(v.magBits / 8);
      const n = (b.length - RESULTS_HEADER_BYTES) / (aw + mw);
      const angle = new Int32Array(n);
      const magnitude = new Int32Array(n);
      const signedOut = v.angleFormat === 'rad';
      // A turn angle is its low angleBits bits (the rest is zero fill): angleBits ≤ 31 keeps it in
      // an Int32Array even when a damaged or careless 4-byte field has its top bit set.
      const turnMask = signedOut ? 0 : 2 ** v.angleBits;
      for (let i = 0, at = RESULTS_HEADER_BYTES; i < n; i++, at += aw + mw) {
        angle[i] = signedOut ? get(b, at, aw, true) : get(b, at, aw, false) % turnMask;
        magnitude[i] = get(b, at + aw, mw, true);
      }
      return { kind, firstIndex: get(b, 0, 4, false), angle, magnitude };
    }
    case Kind.One:
      return { kind, angleCode: get(b, 0, aw, signedAngle) };
    case Kind.List: {
      const codes: number[] = new Array(b.length / aw);
      for (let i = 0; i < codes.length; i++) codes[i] = get(b, i * aw, aw, signedAngle);
      return { kind, angleCodes: codes };
    }
    case Kind.Sweep:
      return { kind, start: get(b, 0, 4, signedAngle), step: get(b, 4, 4, true), count: get(b, 8, 4, false) };
    case Kind.Info: {
      const angleFormat = INFO_FORMATS[b[1]];
      if (!angleFormat) throw new PayloadError(`INFO angleFormat code ${b[1]} is neither 0 (turn) nor 1 (rad)`);
      return {
        kind,
        info: {
          version: b[0],
          angleFormat,
          angleBits: b[2],
          angleFrac: b[3],
          outBits: b[4],
          outFrac: b[5],
          iterations: b[6],
          queueDepth: get(b, 7, 2, false),
          buildId: get(b, 9, 4, false),
          clockKHz: get(b, 13, 4, false),
          name: String.fromCharCode(...b.subarray(INFO_FIXED_BYTES)),
        },
      };
    }
    case Kind.Results: {
      const ow = outBytes(p);
      const n = (b.length - RESULTS_HEADER_BYTES) / (2 * ow);
      const cos = new Int32Array(n);
      const sin = new Int32Array(n);
      for (let i = 0, at = RESULTS_HEADER_BYTES; i < n; i++, at += 2 * ow) {
        cos[i] = get(b, at, ow, true);
        sin[i] = get(b, at + ow, ow, true);
      }
      return { kind, firstIndex: get(b, 0, 4, false), cos, sin };
    }
    case Kind.SweepEnd:
      return { kind, done: get(b, 0, 4, false), status: b[4] };
    case Kind.Ack:
      return { kind, acked: b[0] };
    case Kind.Nak:
      return { kind, refused: b[0], reason: b[1] };
  }
}

/** Builds the whole frame for message `m` with `tag`. */
export function encodeMessage(m: Message, tag: number, p: WireProfile, crcName: Crc8Name = DEFAULT_CRC8): Uint8Array {
  return encodeFrame(m.kind, tag, encodePayload(m, p), crcName);
}

/** The vectoring wire profile of MODE_INFO's formats. */
export function vectorWireProfile(f: VectoringFormats): VectorWireProfile {
  return { inBits: f.inBits, angleFormat: f.angleFormat, angleBits: f.angleBits, magBits: f.magBits };
}

/**
 * Vector k of a grid (k = i·ny + j, y fastest): x0 + i·dx and y0 + j·dy, each wrapped to inBits
 * two's complement, as an inBits-wide adder of the board wraps.
 */
export function gridVector(g: VectorGrid, k: number, p: WireProfile): { x: number; y: number } {
  const j = k % g.ny;
  const i = (k - j) / g.ny;
  const bits = vectorProfile(p).inBits;
  return { x: wrapSigned(g.x0 + i * g.dx, bits), y: wrapSigned(g.y0 + j * g.dy, bits) };
}

/** `v` wrapped to a two's-complement integer of `bits` bits. */
function wrapSigned(v: number, bits: number): number {
  const m = 2 ** bits;
  // i·dx stays below 2^16 · 2^31 = 2^47: exact in a double.
  const u = ((v % m) + m) % m;
  return u >= m / 2 ? u - m : u;
}

/** The wire profile a device announces in its INFO. */
export function profileFromInfo(info: DeviceInfo): WireProfile {
  return { angleFormat: info.angleFormat, angleBits: info.angleBits, outBits: info.outBits };
}

/**
 * Angle code i of a sweep: start + i·step, wrapped to angleBits for `turn`, saturated to the
 * format's range for `rad`.
 */
export function sweepAngleCode(start: number, step: number, i: number, p: WireProfile): number {
  const raw = start + i * step;
  if (p.angleFormat === 'turn') {
    const m = 2 ** p.angleBits;
    if (!Number.isSafeInteger(raw)) {
      // i·step can pass 2^53 (u32 count times i32 step): wrap exactly in BigInt.
      const bm = BigInt(m);
      return Number((((BigInt(start) + BigInt(i) * BigInt(step)) % bm) + bm) % bm);
    }
    return ((raw % m) + m) % m;
  }
  const { min, max } = angleCodeRange(p);
  return Math.min(max, Math.max(min, raw));
}
