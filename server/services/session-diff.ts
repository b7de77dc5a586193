// Bit-exact comparison of two sessions' answers on the angle codes both covered. Each side is
// put in code order through a typed index array, then the two orders are merged; nothing is
// allocated per sample beyond those arrays, so million-sample sessions stay cheap.
import { SAMPLE_BYTES } from '../../shared/link-engine/sample-pack';
import { decodeSamples, type DecodedSamples } from './session-scoring';

/** One code both sessions answered, differently. */
export interface DifferingCode {
  code: number;
  a: { cos: number; sin: number };
  b: { cos: number; sin: number };
}

export interface SessionDiff {
  /** Distinct angle codes both sessions answered. */
  common: number;
  /** Of those, the codes whose cos or sin codes differ. */
  differing: number;
  /** The largest |Δcos| or |Δsin| over the common codes, in output LSBs (0 when none differ). */
  maxAbsDiffLsb: number;
  /** The first differing codes in ascending code order, at most `keep`. */
  firstDiffering: DifferingCode[];
  /** Per bin of the code range (when binning was asked for): differing codes and their largest |Δ| in LSB. */
  byBin?: { differing: number[]; maxAbsDiffLsb: number[] };
}

/** How to place codes in bins for `byBin`: `binOf(code)` is an integer in [0, bins). */
export interface DiffBinning {
  bins: number;
  binOf: (code: number) => number;
}

export const KEEP_DIFFERING = 50;

const INDEX_BITS = 21;
const INDEX_SPAN = 2 ** INDEX_BITS;

/**
 * Sort `order` (0..n−1) by code, then by index. Where each code fits in 32 bits above the lowest
 * and n ≤ 2^21, code and index are packed into one exact double (< 2^53) and sorted natively,
 * several times faster than a comparator; otherwise the comparator sort is used.
 */
function sortByCode(codes: Float64Array, order: Uint32Array): void {
  let min = Infinity;
  let max = -Infinity;
  for (let i = 0; i < codes.length; i++) {
    if (codes[i] < min) min = codes[i];
    if (codes[i] > max) max = codes[i];
  }
  if (codes.length > INDEX_SPAN || max - min >= 2 ** 32) {
    order.sort((x, y) => codes[x] - codes[y] || x - y);
    return;
  }
  const keys = new Float64Array(codes.length);
  for (let i = 0; i < codes.length; i++) keys[i] = (codes[i] - min) * INDEX_SPAN + i;
  keys.sort();
  for (let k = 0; k < keys.length; k++) order[k] = keys[k] % INDEX_SPAN;
}

/**
 * Sample indices in ascending code order, each code once: where a code was answered more than
 * once its first answer stands.
 */
export function uniqueCodeOrder(codes: Float64Array): Uint32Array {
  const order = new Uint32Array(codes.length);
  for (let i = 0; i < order.length; i++) order[i] = i;
  // Sweeps and exhaustive runs arrive in code order already; sorting them again is the slow part.
  let ascending = true;
  for (let i = 1; i < codes.length && ascending; i++) ascending = codes[i - 1] <= codes[i];
  if (!ascending) sortByCode(codes, order);
  let kept = 0;
  for (let k = 0; k < order.length; k++) {
    if (kept > 0 && codes[order[kept - 1]] === codes[order[k]]) continue;
    order[kept++] = order[k];
  }
  return order.subarray(0, kept);
}

/** Compare `b` against `a` code by code; with `binning`, `byBin` is always there. */
export function diffSessions(a: DecodedSamples, b: DecodedSamples, keep: number | undefined, binning: DiffBinning): SessionDiff & Required<Pick<SessionDiff, 'byBin'>>;
export function diffSessions(a: DecodedSamples, b: DecodedSamples, keep?: number, binning?: DiffBinning): SessionDiff;
export function diffSessions(a: DecodedSamples, b: DecodedSamples, keep = KEEP_DIFFERING, binning?: DiffBinning): SessionDiff {
  const oa = uniqueCodeOrder(a.codes);
  const ob = uniqueCodeOrder(b.codes);
  const out: SessionDiff = { common: 0, differing: 0, maxAbsDiffLsb: 0, firstDiffering: [] };
  const byBin = binning ? { differing: new Array<number>(binning.bins).fill(0), maxAbsDiffLsb: new Array<number>(binning.bins).fill(0) } : undefined;
  let i = 0;
  let j = 0;
  while (i < oa.length && j < ob.length) {
    const ia = oa[i];
    const ib = ob[j];
    const ca = a.codes[ia];
    const cb = b.codes[ib];
    if (ca < cb) {
      i++;
      continue;
    }
    if (cb < ca) {
      j++;
      continue;
    }
    out.common++;
    const dCos = Math.abs(a.cos[ia] - b.cos[ib]);
    const dSin = Math.abs(a.sin[ia] - b.sin[ib]);
    if (dCos !== 0 || dSin !== 0) {
      out.differing++;
      out.maxAbsDiffLsb = Math.max(out.maxAbsDiffLsb, dCos, dSin);
      if (byBin) {
        const bin = binning!.binOf(ca);
        byBin.differing[bin]++;
        byBin.maxAbsDiffLsb[bin] = Math.max(byBin.maxAbsDiffLsb[bin], dCos, dSin);
      }
      if (out.firstDiffering.length < keep) {
        out.firstDiffering.push({ code: ca, a: { cos: a.cos[ia], sin: a.sin[ia] }, b: { cos: b.cos[ib], sin: b.sin[ib] } });
      }
    }
    i++;
    j++;
  }
  if (byBin) out.byBin = byBin;
  return out;
}

/** The packed samples' columns read in place: codes, cos and sin at stride 3 (no copy when aligned). */
interface PackedColumns {
  codes: Uint32Array | Int32Array;
  values: Int32Array;
  n: number;
}

const LITTLE_ENDIAN = new Uint8Array(new Uint32Array([1]).buffer)[0] === 1;

function packedColumns(bytes: Uint8Array, angleFormat: 'turn' | 'rad'): PackedColumns | null {
  if (!LITTLE_ENDIAN || bytes.length % SAMPLE_BYTES !== 0) return null;
  // A blob read from the database may sit at any offset: copy it once to align it.
  const aligned = bytes.byteOffset % 4 === 0 ? bytes : bytes.slice();
  const n = aligned.length / SAMPLE_BYTES;
  const words = aligned.length / 4;
  const values = new Int32Array(aligned.buffer, aligned.byteOffset, words);
  const codes = angleFormat === 'turn' ? new Uint32Array(aligned.buffer, aligned.byteOffset, words) : values;
  return { codes, values, n };
}

function ascending(c: PackedColumns): boolean {
  const { codes, n } = c;
  for (let i = 1, at = 3; i < n; i++, at += 3) if (codes[at - 3] > codes[at]) return false;
  return true;
}

/**
 * diffSessions on packed samples (shared/link-engine/sample-pack.ts). Where both sessions answered
 * in code order (sweeps, exhaustive runs) the two blobs are merged in one pass in place, without
 * decoding them into columns; otherwise they are decoded and diffed by diffSessions. Same answer.
 */
export function diffPacked(a: Uint8Array, b: Uint8Array, angleFormat: 'turn' | 'rad', keep: number | undefined, binning: DiffBinning): SessionDiff & Required<Pick<SessionDiff, 'byBin'>> {
  const pa = packedColumns(a, angleFormat);
  const pb = packedColumns(b, angleFormat);
  if (!pa || !pb || !ascending(pa) || !ascending(pb)) {
    return diffSessions(decodeSamples(a, angleFormat), decodeSamples(b, angleFormat), keep, binning);
  }
  const limit = keep ?? KEEP_DIFFERING;
  const firstDiffering: DifferingCode[] = [];
  const byBin = { differing: new Array<number>(binning.bins).fill(0), maxAbsDiffLsb: new Array<number>(binning.bins).fill(0) };
  const { codes: codesA, values: va, n: na } = pa;
  const { codes: codesB, values: vb, n: nb } = pb;
  const endA = na * 3;
  const endB = nb * 3;
  // Counters in locals, not object fields: this loop runs once per sample of both sessions.
  let common = 0;
  let differing = 0;
  let maxAbsDiffLsb = 0;
  let i = 0;
  let j = 0;
  while (i < endA && j < endB) {
    const ca = codesA[i];
    const cb = codesB[j];
    if (ca < cb) {
      i += 3;
      continue;
    }
    if (cb < ca) {
      j += 3;
      continue;
    }
    common++;
    const cosA = va[i + 1];
    const sinA = va[i + 2];
    const cosB = vb[j + 1];
    const sinB = vb[j + 2];
    if (cosA !== cosB || sinA !== sinB) {
      const dCos = Math.abs(cosA - cosB);
      const dSin = Math.abs(sinA - sinB);
      differing++;
      const d = dCos > dSin ? dCos : dSin;
      if (d > maxAbsDiffLsb) maxAbsDiffLsb = d;
      const bin = binning.binOf(ca);
      byBin.differing[bin]++;
      if (d > byBin.maxAbsDiffLsb[bin]) byBin.maxAbsDiffLsb[bin] = d;
      if (firstDiffering.length < limit) firstDiffering.push({ code: ca, a: { cos: cosA, sin: sinA }, b: { cos: cosB, sin: sinB } });
    }
    // A code answered more than once: its first answer stands, as in uniqueCodeOrder.
    i += 3;
    while (i < endA && codesA[i] === ca) i += 3;
    j += 3;
    while (j < endB && codesB[j] === cb) j += 3;
  }
  return { common, differing, maxAbsDiffLsb, firstDiffering, byBin };
}
