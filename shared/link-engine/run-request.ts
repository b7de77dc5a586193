import { sweepAngleCode } from '../link/payloads';
import type { WireProfile } from '../link/wire-profile';

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
