// The few facts about a core that the codec needs to size and read payload fields, and the LEN
// values each KIND can have under them.
import { Kind } from './kinds';

/** How a core's numbers travel on the wire; it follows the device's INFO. */
export interface WireProfile {
  /** `turn`: unsigned binary angle; `rad`: signed two's-complement radians. */
  angleFormat: 'turn' | 'rad';
  /** Total bits of an angle code, 1..32. */
  angleBits: number;
  /** Total bits of an output code (signed), 2..32. */
  outBits: number;
  /**
   * The vectoring formats (bench link version 2), from the device's MODE_INFO; absent for a
   * board that only rotates, when the VEC_* KINDs are sized by DEFAULT_VECTOR_PROFILE.
   */
  vector?: VectorWireProfile;
}

/** How a vectoring core's numbers travel: x/y inputs in, (angle, magnitude) pairs out. */
export interface VectorWireProfile {
  /** Total bits of an x or y input code (signed), 2..32. */
  inBits: number;
  /** The angle output: `turn` unsigned binary angle, `rad` signed radians. */
  angleFormat: 'turn' | 'rad';
  /** Total bits of an angle output code, 1..31 (answers are kept in Int32Array columns). */
  angleBits: number;
  /** Total bits of a magnitude output code (signed), 2..32. */
  magBits: number;
}

/** 16-bit x/y in, 16-bit binary angles and 18-bit magnitudes out: the default vectoring core. */
export const DEFAULT_VECTOR_PROFILE: Readonly<VectorWireProfile> = { inBits: 16, angleFormat: 'turn', angleBits: 16, magBits: 18 };

/** 16-bit binary angles in, 16-bit outputs back: the protocol's default core. */
export const DEFAULT_PROFILE: Readonly<WireProfile> = { angleFormat: 'turn', angleBits: 16, outBits: 16 };

/** Largest payload a frame can carry. */
export const MAX_PAYLOAD = 255;
/** Fixed bytes of an INFO payload before the ASCII name. */
export const INFO_FIXED_BYTES = 17;
/** Bytes of the firstIndex field that opens a RESULTS payload. */
export const RESULTS_HEADER_BYTES = 4;
/** Fixed bytes of a MODE_INFO payload; a later version may append more, which hosts skip. */
export const MODE_INFO_FIXED_BYTES = 9;
/** A VEC_GRID payload: x0 i32, dx i32, y0 i32, dy i32, nx u16, ny u16. */
export const VEC_GRID_BYTES = 20;

/** Raised when a wire profile has an unusable field; the message names the field. */
export class WireProfileError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'WireProfileError';
  }
}

/** Checks a profile and returns it; throws WireProfileError naming the bad field. */
export function validateProfile(p: WireProfile): WireProfile {
  if (p.angleFormat !== 'turn' && p.angleFormat !== 'rad') {
    throw new WireProfileError(`angleFormat must be "turn" or "rad", got ${JSON.stringify(p.angleFormat)}`);
  }
  if (!Number.isInteger(p.angleBits) || p.angleBits < 1 || p.angleBits > 32) {
    throw new WireProfileError(`angleBits must be an integer 1..32, got ${p.angleBits}`);
  }
  if (!Number.isInteger(p.outBits) || p.outBits < 2 || p.outBits > 32) {
    throw new WireProfileError(`outBits must be an integer 2..32, got ${p.outBits}`);
  }
  if (p.vector !== undefined) validateVectorProfile(p.vector);
  return p;
}

/** Checks a vectoring profile and returns it; throws WireProfileError naming the bad field. */
export function validateVectorProfile(v: VectorWireProfile): VectorWireProfile {
  const bits = (field: 'inBits' | 'magBits', min: number) => {
    if (!Number.isInteger(v[field]) || v[field] < min || v[field] > 32) throw new WireProfileError(`vector.${field} must be an integer ${min}..32, got ${v[field]}`);
  };
  bits('inBits', 2);
  if (v.angleFormat !== 'turn' && v.angleFormat !== 'rad') throw new WireProfileError(`vector.angleFormat must be "turn" or "rad", got ${JSON.stringify(v.angleFormat)}`);
  if (!Number.isInteger(v.angleBits) || v.angleBits < 1 || v.angleBits > 31) throw new WireProfileError(`vector.angleBits must be an integer 1..31, got ${v.angleBits}`);
  bits('magBits', 2);
  return v;
}

/** The vectoring formats in force: the device's, or the default core's before MODE_INFO. */
export function vectorProfile(p: WireProfile): VectorWireProfile {
  return p.vector ?? DEFAULT_VECTOR_PROFILE;
}

/** Bytes of one x or y field: ceil(inBits / 8). */
export function inputBytes(p: WireProfile): number {
  return Math.ceil(vectorProfile(p).inBits / 8);
}

/** Bytes of one (angle, magnitude) pair of VEC_RESULTS: ceil(angleBits / 8) + ceil(magBits / 8). */
export function vectorPairBytes(p: WireProfile): number {
  const v = vectorProfile(p);
  return Math.ceil(v.angleBits / 8) + Math.ceil(v.magBits / 8);
}

/** How many (x, y) vectors one VEC_LIST frame can carry. */
export function maxVectorListPairs(p: WireProfile): number {
  return Math.floor(MAX_PAYLOAD / (2 * inputBytes(p)));
}

/** How many (angle, magnitude) pairs one VEC_RESULTS frame can carry. */
export function maxVectorResultPairs(p: WireProfile): number {
  return Math.floor((MAX_PAYLOAD - RESULTS_HEADER_BYTES) / vectorPairBytes(p));
}

/** Smallest and largest x or y code: two's complement in inBits. */
export function inputCodeRange(p: WireProfile): { min: number; max: number } {
  const { inBits } = vectorProfile(p);
  return { min: -(2 ** (inBits - 1)), max: 2 ** (inBits - 1) - 1 };
}

/** True when `code` is a valid x or y input (the device answers NAK 7 otherwise). */
export function isInputCodeInRange(code: number, p: WireProfile): boolean {
  const { min, max } = inputCodeRange(p);
  return Number.isInteger(code) && code >= min && code <= max;
}

/** Bytes of one angle field: ceil(angleBits / 8). */
export function angleBytes(p: WireProfile): number {
  return Math.ceil(p.angleBits / 8);
}

/** Bytes of one output field: ceil(outBits / 8). */
export function outBytes(p: WireProfile): number {
  return Math.ceil(p.outBits / 8);
}

/** How many angle codes one LIST frame can carry. */
export function maxListCodes(p: WireProfile): number {
  return Math.floor(MAX_PAYLOAD / angleBytes(p));
}

/** How many (cos, sin) pairs one RESULTS frame can carry. */
export function maxResultPairs(p: WireProfile): number {
  return Math.floor((MAX_PAYLOAD - RESULTS_HEADER_BYTES) / (2 * outBytes(p)));
}

/** Smallest and largest valid angle code of the profile (unsigned for turn, signed for rad). */
export function angleCodeRange(p: WireProfile): { min: number; max: number } {
  return p.angleFormat === 'turn'
    ? { min: 0, max: 2 ** p.angleBits - 1 }
    : { min: -(2 ** (p.angleBits - 1)), max: 2 ** (p.angleBits - 1) - 1 };
}

/** True when `code` is a valid angle for the profile (the device answers NAK 6 otherwise). */
export function isAngleCodeInRange(code: number, p: WireProfile): boolean {
  const { min, max } = angleCodeRange(p);
  return Number.isInteger(code) && code >= min && code <= max;
}

/**
 * True when a frame of `kind` may have payload length `len` under profile `p`. LIST needs at
 * least one whole angle code, RESULTS at least one whole pair, INFO at least its fixed fields.
 * Unknown KINDs have no possible length.
 */
export function isPossibleLength(kind: number, len: number, p: WireProfile): boolean {
  switch (kind) {
    case Kind.Hello:
    case Kind.Pause:
    case Kind.Resume:
    case Kind.Abort:
      return len === 0;
    case Kind.One:
      return len === angleBytes(p);
    case Kind.List: {
      const a = angleBytes(p);
      return len >= a && len % a === 0;
    }
    case Kind.Sweep:
      return len === 12;
    case Kind.Info:
      return len >= INFO_FIXED_BYTES;
    case Kind.Results: {
      const pair = 2 * outBytes(p);
      return len >= RESULTS_HEADER_BYTES + pair && (len - RESULTS_HEADER_BYTES) % pair === 0;
    }
    case Kind.Modes:
      return len === 0;
    case Kind.VecOne:
      return len === 2 * inputBytes(p);
    case Kind.VecList: {
      const pair = 2 * inputBytes(p);
      return len >= pair && len % pair === 0;
    }
    case Kind.VecGrid:
      return len === VEC_GRID_BYTES;
    case Kind.ModeInfo:
      return len >= MODE_INFO_FIXED_BYTES;
    case Kind.VecResults: {
      const pair = vectorPairBytes(p);
      return len >= RESULTS_HEADER_BYTES + pair && (len - RESULTS_HEADER_BYTES) % pair === 0;
    }
    case Kind.SweepEnd:
      return len === 5;
    case Kind.Ack:
      return len === 1;
    case Kind.Nak:
      return len === 2;
    default:
      return false;
  }
}
