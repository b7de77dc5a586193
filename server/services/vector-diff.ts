// Comparison of two vectoring sessions on the input vectors both answered: how many answers
// differ, by how much in angle (wrapped at half a turn) and magnitude, and where by direction.
// Each side's vectors are put in (x, y) order once (session-diff.ts's uniqueCodeOrder on a key
// packing the pair); where a vector was answered more than once its first answer stands.
import { inputRange, parseVectorConfig, wrapAngleError } from '../../shared/vectoring';
import type { VectorSamples } from '../../shared/link-engine/vector-sample-pack';
import { KEEP_DIFFERING, uniqueCodeOrder } from './session-diff';
import { directionBin } from './vector-scoring';

export interface DifferingVector {
  x: number;
  y: number;
  /** The direction of (x, y) in degrees, [0, 360). */
  degrees: number;
  a: { angle: number; magnitude: number };
  b: { angle: number; magnitude: number };
}

export interface VectorDiff {
  /** Distinct (x, y) vectors both sessions answered. */
  common: number;
  /** Of those, the vectors whose angle or magnitude codes differ. */
  differing: number;
  /** The larger of the two below (0 when none differ). */
  maxAbsDiffLsb: number;
  maxAbsAngleDiffLsb: number;
  maxAbsMagnitudeDiffLsb: number;
  /** The first differing vectors in (x, y) order, at most `keep`. */
  firstDiffering: DifferingVector[];
  /** Per bin of direction: differing vectors and their largest difference in LSB. */
  byBin: { differing: number[]; maxAbsDiffLsb: number[] };
}

const degreesOf = (x: number, y: number) => {
  const d = (Math.atan2(y, x) * 180) / Math.PI;
  return d < 0 ? d + 360 : d;
};

/** Compare `b` against `a` vector by vector, under the configuration of `a`'s core. */
export function diffVectorSessions(vectorConfig: unknown, a: VectorSamples, b: VectorSamples, bins: number, keep = KEEP_DIFFERING): VectorDiff {
  const config = parseVectorConfig(vectorConfig);
  const period = config.angleFormat === 'turn' ? 2 ** config.angleBits : 2 * Math.PI * 2 ** config.angleFrac;
  const { min, max } = inputRange(config);
  const span = max - min + 1;
  const keysOf = (s: VectorSamples) => Float64Array.from(s.xs, (x, i) => (x - min) * span + (s.ys[i] - min));
  const ka = keysOf(a);
  const kb = keysOf(b);
  const oa = uniqueCodeOrder(ka);
  const ob = uniqueCodeOrder(kb);
  const out: VectorDiff = {
    common: 0,
    differing: 0,
    maxAbsDiffLsb: 0,
    maxAbsAngleDiffLsb: 0,
    maxAbsMagnitudeDiffLsb: 0,
    firstDiffering: [],
    byBin: { differing: new Array<number>(bins).fill(0), maxAbsDiffLsb: new Array<number>(bins).fill(0) },
  };
  let i = 0;
  let j = 0;
  while (i < oa.length && j < ob.length) {
    const ia = oa[i];
    const ib = ob[j];
    if (ka[ia] < kb[ib]) {
      i++;
      continue;
    }
    if (kb[ib] < ka[ia]) {
      j++;
      continue;
    }
    out.common++;
    const dAngle = Math.abs(wrapAngleError(a.angles[ia] - b.angles[ib], period));
    const dMag = Math.abs(a.magnitudes[ia] - b.magnitudes[ib]);
    if (dAngle !== 0 || dMag !== 0) {
      const x = a.xs[ia];
      const y = a.ys[ia];
      const d = Math.max(dAngle, dMag);
      out.differing++;
      out.maxAbsAngleDiffLsb = Math.max(out.maxAbsAngleDiffLsb, dAngle);
      out.maxAbsMagnitudeDiffLsb = Math.max(out.maxAbsMagnitudeDiffLsb, dMag);
      out.maxAbsDiffLsb = Math.max(out.maxAbsDiffLsb, d);
      const bin = directionBin(x, y, bins);
      out.byBin.differing[bin]++;
      out.byBin.maxAbsDiffLsb[bin] = Math.max(out.byBin.maxAbsDiffLsb[bin], d);
      if (out.firstDiffering.length < keep) {
        out.firstDiffering.push({ x, y, degrees: degreesOf(x, y), a: { angle: a.angles[ia], magnitude: a.magnitudes[ia] }, b: { angle: b.angles[ib], magnitude: b.magnitudes[ib] } });
      }
    }
    i++;
    j++;
  }
  return out;
}
