// What the best hypothesis leaves unexplained: scattered (single answers here and there, as a
// damaged line or an unstable core gives) or structured (many, or in runs of neighbouring codes,
// as a second defect gives). The thresholds are a rule of thumb (common practice, no source).
export type Rest = 'scattered' | 'structured';

/** More than this share of answers left unexplained is taken for a second defect. */
export const SCATTERED_MAX_SHARE = 0.01;
/** More than this share of the unexplained answers next to another one is a run, not scatter. */
export const RUN_SHARE = 0.25;

/** Classifies the answers where (outCos, outSin) differs from the board's (cos, sin). */
export function classifyRest(codes: ArrayLike<number>, cos: ArrayLike<number>, sin: ArrayLike<number>, outCos: ArrayLike<number>, outSin: ArrayLike<number>): Rest {
  const n = codes.length;
  const miss = new Uint8Array(n);
  let m = 0;
  for (let k = 0; k < n; k++) {
    if (cos[k] !== outCos[k] || sin[k] !== outSin[k]) {
      miss[k] = 1;
      m++;
    }
  }
  if (m > SCATTERED_MAX_SHARE * n) return 'structured';
  if (m < 4) return 'scattered';
  // Neighbours in angle order, whatever order the answers came in.
  const order = Int32Array.from({ length: n }, (_, i) => i).sort((a, b) => codes[a] - codes[b]);
  let inRuns = 0;
  for (let r = 0; r < n; r++) {
    if (!miss[order[r]]) continue;
    if ((r > 0 && miss[order[r - 1]]) || (r + 1 < n && miss[order[r + 1]])) inRuns++;
  }
  return inRuns > RUN_SHARE * m ? 'structured' : 'scattered';
}
