// KIND codes, NAK reasons and SWEEP_END statuses of the bench link (docs/protocol.md): version 1,
// and the vectoring KINDs version 2 adds (MODES and VEC_*; section 8).

/** Every KIND of frame on the bench link. 0x0_–0x2_ go host → device, 0x8_–0xA_ device → host. */
export const Kind = {
  Hello: 0x01,
  Modes: 0x02,
  One: 0x10,
  List: 0x11,
  Sweep: 0x12,
  VecOne: 0x13,
  VecList: 0x14,
  VecGrid: 0x15,
  Pause: 0x20,
  Resume: 0x21,
  Abort: 0x22,
  Info: 0x81,
  ModeInfo: 0x82,
  Results: 0x90,
  VecResults: 0x91,
  SweepEnd: 0x92,
  Ack: 0xa0,
  Nak: 0xaf,
} as const;

/** One of the KIND codes in `Kind`. */
export type KindCode = (typeof Kind)[keyof typeof Kind];

/** The requests of version 1: what a board that only rotates knows (it answers NAK 3 to the rest). */
export const ROTATION_REQUEST_KINDS: readonly KindCode[] = [Kind.Hello, Kind.One, Kind.List, Kind.Sweep, Kind.Pause, Kind.Resume, Kind.Abort];
/** The requests of a vectoring-only board: version 2 without ONE, LIST and SWEEP. */
export const VECTOR_REQUEST_KINDS: readonly KindCode[] = [Kind.Hello, Kind.Modes, Kind.VecOne, Kind.VecList, Kind.VecGrid, Kind.Pause, Kind.Resume, Kind.Abort];
/** KINDs the host sends. */
export const REQUEST_KINDS: readonly KindCode[] = [...ROTATION_REQUEST_KINDS, Kind.Modes, Kind.VecOne, Kind.VecList, Kind.VecGrid];
/** KINDs the device sends. */
export const REPLY_KINDS: readonly KindCode[] = [Kind.Info, Kind.ModeInfo, Kind.Results, Kind.VecResults, Kind.SweepEnd, Kind.Ack, Kind.Nak];

const NAMES = new Map<number, string>(Object.entries(Kind).map(([k, v]) => [v, k.replace(/([a-z])([A-Z])/g, '$1_$2').toUpperCase()]));

/** The wire name of a KIND ("SWEEP_END"), or "0x.." for an unknown code. */
export function kindName(kind: number): string {
  return NAMES.get(kind) ?? `0x${kind.toString(16).padStart(2, '0').toUpperCase()}`;
}

/** True for a KIND defined by the protocol. */
export function isKnownKind(kind: number): kind is KindCode {
  return NAMES.has(kind);
}

/** Why a device refused a request (the second byte of a NAK payload). */
export const NakReason = {
  BadCheck: 1,
  BadLength: 2,
  UnknownKind: 3,
  Paused: 4,
  QueueFull: 5,
  AngleOutOfRange: 6,
  /** Version 2: an x or y code outside the input format (VEC_ONE, VEC_LIST, a VEC_GRID start). */
  VectorOutOfRange: 7,
} as const;

/** One of the codes in `NakReason`. */
export type NakReasonCode = (typeof NakReason)[keyof typeof NakReason];

/** How a sweep ended (the status byte of SWEEP_END). */
export const SweepStatus = {
  Complete: 0,
  Aborted: 1,
  Overflow: 2,
} as const;

/** One of the codes in `SweepStatus`. */
export type SweepStatusCode = (typeof SweepStatus)[keyof typeof SweepStatus];
