// Which answers the search screens hypotheses on: a small spread that touches every octant, both
// signs, the extremes and both sides of each octant boundary, and a larger seeded random sample.
import type { ModelConfig } from '../numeric';

export const SMALL_SCREEN = 128;
export const LARGE_SCREEN = 2048;

/** A small seeded generator (mulberry32), so a search is repeatable. */
export function seededRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Angle codes at the octant boundaries of the core's angle format. */
function octantBoundaries(c: ModelConfig): number[] {
  if (c.angleFormat === 'turn') return Array.from({ length: 8 }, (_, k) => (k * 2 ** c.angleBits) / 8);
  const eighth = (Math.PI / 4) * 2 ** c.angleFrac;
  return Array.from({ length: 17 }, (_, k) => Math.round((k - 8) * eighth));
}

/** Indices into `codes` of the two screening sets; the small set is part of the large one. */
export function pickScreen(c: ModelConfig, codes: Float64Array): { small: Int32Array; large: Int32Array } {
  return pickScreenBy(codes, octantBoundaries(c), []);
}

/**
 * The two screening sets over answers ordered by `keys` (an angle code, or a vector's direction):
 * the extremes, a spread, both neighbours of each of the `boundaries`, the `extra` indices, then
 * seeded random ones.
 */
export function pickScreenBy(keys: ArrayLike<number>, boundaries: readonly number[], extra: readonly number[]): { small: Int32Array; large: Int32Array } {
  const n = keys.length;
  const order = Int32Array.from({ length: n }, (_, i) => i).sort((a, b) => keys[a] - keys[b]);
  const small = new Set<number>([order[0], order[n - 1]]);
  const spread = Math.min(n, SMALL_SCREEN / 2);
  for (let k = 0; k < spread; k++) small.add(order[Math.floor((k * n) / spread)]);
  // Both neighbours of each boundary: the fold and the direction decisions change there.
  for (const b of boundaries) {
    let lo = 0;
    let hi = n;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (keys[order[mid]] < b) lo = mid + 1;
      else hi = mid;
    }
    for (const at of [lo - 1, lo, lo + 1]) if (at >= 0 && at < n) small.add(order[at]);
  }
  for (const i of extra) small.add(i);
  const random = seededRandom(0x5eed);
  while (small.size < Math.min(n, SMALL_SCREEN + 32)) small.add(Math.floor(random() * n));
  const large = new Set(small);
  if (n <= LARGE_SCREEN) for (let i = 0; i < n; i++) large.add(i);
  else while (large.size < LARGE_SCREEN) large.add(Math.floor(random() * n));
  return { small: Int32Array.from(small), large: Int32Array.from(large) };
}
