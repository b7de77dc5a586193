// What a run asks for, in the terms the Run needs and no more: the frames that ask for some of
// its inputs (ONE/LIST or VEC_ONE/VEC_LIST), the segments the device expands itself (SWEEP or
// VEC_GRID), and the reply that answers them. One Run then drives rotating and vectoring cores
// alike: queue depth, TAGs, losses, retries and confirmation are the same machinery.
import { Kind } from '../link/kinds';
import { encodePayload, gridVector, type Message, type VectorGrid } from '../link/payloads';
import { maxListCodes, maxVectorListPairs, type WireProfile } from '../link/wire-profile';

/** KINDs that ask for inputs the host lists. */
export type ListKind = typeof Kind.One | typeof Kind.List | typeof Kind.VecOne | typeof Kind.VecList;
/** KINDs whose inputs the device generates, ended by SWEEP_END. */
export type ExpandedKind = typeof Kind.Sweep | typeof Kind.VecGrid;
/** Every request KIND a run sends. */
export type RunKind = ListKind | ExpandedKind;

/** True for a request the device expands itself (its results count against no queue). */
export const isExpandedKind = (kind: number): kind is ExpandedKind => kind === Kind.Sweep || kind === Kind.VecGrid;

/**
 * One frame's worth of a run's answers in the reply's two columns: cos and sin for a rotating
 * core, angle and magnitude (in that order) for a vectoring one.
 */
export interface AnswerColumns {
  firstIndex: number;
  cos: Int32Array;
  sin: Int32Array;
}

export interface RunSource {
  /** Inputs in the run. */
  readonly count: number;
  /** What names each input in the missing list: the angle codes, or the vectors' x codes. */
  readonly keys: ArrayLike<number>;
  /** Most inputs one list request can carry. */
  readonly maxList: number;
  /** The request asking for these run indexes (ONE for one, LIST for more). */
  listRequest(indexes: number[]): { kind: ListKind; payload: Uint8Array };
  /**
   * The next device-expanded segment starting at run index `first`, at most `max` inputs (at
   * least one); null when the run is an explicit list.
   */
  readonly expanded: ((first: number, max: number) => { kind: ExpandedKind; payload: Uint8Array; count: number }) | null;
  /** The answers of a reply frame to this run, or null when the frame carries none. */
  answers(m: Message): AnswerColumns | null;
}

/** A rotating core's run: angle codes, answered by RESULTS (cos, sin). */
export function rotationSource(codes: Float64Array, sweep: { step: number } | null, p: WireProfile): RunSource {
  return {
    count: codes.length,
    keys: codes,
    maxList: maxListCodes(p),
    listRequest: (indexes) =>
      indexes.length === 1
        ? { kind: Kind.One, payload: encodePayload({ kind: Kind.One, angleCode: codes[indexes[0]] }, p) }
        : { kind: Kind.List, payload: encodePayload({ kind: Kind.List, angleCodes: indexes.map((i) => codes[i]) }, p) },
    expanded: sweep
      ? (first, max) => {
          const count = Math.min(max, codes.length - first);
          return { kind: Kind.Sweep, count, payload: encodePayload({ kind: Kind.Sweep, start: codes[first], step: sweep.step, count }, p) };
        }
      : null,
    answers: (m) => (m.kind === Kind.Results ? m : null),
  };
}

/** A vectoring core's run: (x, y) inputs, answered by VEC_RESULTS (angle, magnitude). */
export function vectorSource(xs: Int32Array, ys: Int32Array, grid: VectorGrid | null, p: WireProfile): RunSource {
  return {
    count: xs.length,
    keys: xs,
    maxList: maxVectorListPairs(p),
    listRequest: (indexes) =>
      indexes.length === 1
        ? { kind: Kind.VecOne, payload: encodePayload({ kind: Kind.VecOne, x: xs[indexes[0]], y: ys[indexes[0]] }, p) }
        : { kind: Kind.VecList, payload: encodePayload({ kind: Kind.VecList, xs: indexes.map((i) => xs[i]), ys: indexes.map((i) => ys[i]) }, p) },
    expanded: grid ? (first, max) => gridSegment(grid, first, max, p) : null,
    answers: (m) => (m.kind === Kind.VecResults ? { firstIndex: m.firstIndex, cos: m.angle, sin: m.magnitude } : null),
  };
}

/**
 * The grid's points from run index `first` on, as one smaller grid whose points are consecutive
 * run indexes: whole columns (one x, every y) when `first` starts a column and a column fits in
 * `max`, else the rest of one column (at most `max` points).
 */
export function gridSegment(g: VectorGrid, first: number, max: number, p: WireProfile): { kind: typeof Kind.VecGrid; payload: Uint8Array; count: number } {
  const within = first % g.ny;
  const start = gridVector(g, first, p);
  let seg: VectorGrid;
  if (within === 0 && g.ny <= max) {
    const columns = Math.min(Math.floor(max / g.ny), g.nx - first / g.ny);
    seg = { x0: start.x, dx: g.dx, nx: columns, y0: start.y, dy: g.dy, ny: g.ny };
  } else {
    seg = { x0: start.x, dx: g.dx, nx: 1, y0: start.y, dy: g.dy, ny: Math.min(max, g.ny - within) };
  }
  return { kind: Kind.VecGrid, count: seg.nx * seg.ny, payload: encodePayload({ kind: Kind.VecGrid, ...seg }, p) };
}
