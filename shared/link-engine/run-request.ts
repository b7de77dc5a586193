import { gridVector, sweepAngleCode, type VectorGrid } from '../link/payloads';
import { inputCodeRange, type WireProfile } from '../link/wire-profile';

/**
 * What a run asks the device for: either an explicit list of angle codes, or an arithmetic
 * progression the device can generate itself with SWEEP (start + i·step, wrapped for `turn`,
 * saturated for `rad`, as the bench link defines).
 */
export type RunRequest =
  | { kind: 'codes'; codes: ArrayLike<number> }
  | { kind: 'sweep'; start: number; step: number; count: number };

/** Largest run the engine accepts: 2^24 results keep the buffers near 200 MB at most. */
export const MAX_RUN_RESULTS = 1 << 24;

/** Every code of a run, in request order, as one typed array. */
export function expandRequest(req: RunRequest, p: WireProfile): Float64Array {
  const count = req.kind === 'codes' ? req.codes.length : req.count;
  if (!Number.isInteger(count) || count < 1 || count > MAX_RUN_RESULTS) {
    throw new RangeError(`a run needs 1..${MAX_RUN_RESULTS} codes, got ${count}`);
  }
  if (req.kind === 'codes') return Float64Array.from(req.codes);
  const out = new Float64Array(count);
  for (let i = 0; i < count; i++) out[i] = sweepAngleCode(req.start, req.step, i, p);
  return out;
}

/**
 * What a vectoring run asks for: an explicit list of (x, y) input codes, or a grid the device
 * expands itself with VEC_GRID (x0 + i·dx for i < nx, y0 + j·dy for j < ny, y fastest; each
 * coordinate wraps in the input format, as the bench link defines).
 */
export type VectorRunRequest = { kind: 'vectors'; xs: ArrayLike<number>; ys: ArrayLike<number> } | ({ kind: 'grid' } & VectorGrid);

/** Largest nx or ny of a grid: VEC_GRID's u16 fields. */
export const MAX_GRID_SIDE = 0xffff;

/** Every input of a vectoring run, in request order, as two typed columns. @throws RangeError naming the field */
export function expandVectorRequest(req: VectorRunRequest, p: WireProfile): { xs: Int32Array; ys: Int32Array } {
  const { min, max } = inputCodeRange(p);
  const inRange = (v: number) => Number.isInteger(v) && v >= min && v <= max;
  if (req.kind === 'vectors') {
    const n = req.xs.length;
    if (req.ys.length !== n) throw new RangeError(`x and y differ in length (${n}, ${req.ys.length})`);
    if (n < 1 || n > MAX_RUN_RESULTS) throw new RangeError(`a run needs 1..${MAX_RUN_RESULTS} vectors, got ${n}`);
    const xs = new Int32Array(n);
    const ys = new Int32Array(n);
    for (let i = 0; i < n; i++) {
      if (!inRange(req.xs[i]) || !inRange(req.ys[i])) throw new RangeError(`vector ${i} (${req.xs[i]}, ${req.ys[i]}) is outside the input format (${min}..${max})`);
      xs[i] = req.xs[i];
      ys[i] = req.ys[i];
    }
    return { xs, ys };
  }
  for (const k of ['nx', 'ny'] as const) {
    if (!Number.isInteger(req[k]) || req[k] < 1 || req[k] > MAX_GRID_SIDE) throw new RangeError(`grid ${k} must be an integer 1..${MAX_GRID_SIDE}, got ${req[k]}`);
  }
  for (const k of ['x0', 'y0'] as const) if (!inRange(req[k])) throw new RangeError(`grid ${k} must be an input code ${min}..${max}, got ${req[k]}`);
  for (const k of ['dx', 'dy'] as const) {
    if (!Number.isInteger(req[k]) || req[k] < -(2 ** 31) || req[k] >= 2 ** 31) throw new RangeError(`grid ${k} must be a 32-bit signed integer, got ${req[k]}`);
  }
  const n = req.nx * req.ny;
  if (n > MAX_RUN_RESULTS) throw new RangeError(`a run needs 1..${MAX_RUN_RESULTS} vectors, the grid has ${n}`);
  const xs = new Int32Array(n);
  const ys = new Int32Array(n);
  for (let k = 0; k < n; k++) {
    const v = gridVector(req, k, p);
    xs[k] = v.x;
    ys[k] = v.y;
  }
  return { xs, ys };
}
