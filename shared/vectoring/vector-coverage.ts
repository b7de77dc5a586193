// How much of the input plane a session has covered: occupancy of a grid of cells over the x–y
// square, of angle sectors and of magnitude rings, and (for inputs up to 12 + 12 bits) the exact
// number of distinct pairs. A cell, sector or ring is covered once any answer falls in it.
import { inputRange, type VectorConfig } from './vector-config';

/** How finely coverage divides the plane. */
export interface VectorCoverageOptions {
  /** Cells along each axis of the input square (default 16: 256 cells). */
  cellsPerAxis: number;
  /** Equal sectors of the full turn, the first starting at angle 0 (default 16). */
  sectors: number;
  /** Equal-width rings of the radius over [0, √2 · full scale], the corners in the last (default 8). */
  rings: number;
}

export const DEFAULT_VECTOR_COVERAGE: Readonly<VectorCoverageOptions> = Object.freeze({ cellsPerAxis: 16, sectors: 16, rings: 8 });

/** Pairs are counted exactly in a bit set up to this many bits of x and y together (2 MiB). */
const DISTINCT_MAX_BITS = 24;

/** Answers per part and how many parts hold at least one. */
export interface Occupancy {
  counts: number[];
  occupied: number;
  total: number;
  share: number;
}

/** Coverage of the input plane, as plain data. */
export interface VectorCoverageSummary {
  cellsPerAxis: number;
  cells: Occupancy;
  sectors: Occupancy;
  rings: Occupancy;
  /** Answers to the zero vector, which lies in no sector. */
  zeroVectors: number;
  /** Distinct (x, y) pairs seen; null when x and y together exceed 24 bits. */
  distinct: number | null;
  /** Pairs the format holds: 2^(2·inBits). */
  total: number;
}

function occupancy(counts: Float64Array): Occupancy {
  let occupied = 0;
  for (const c of counts) if (c > 0) occupied++;
  return { counts: Array.from(counts), occupied, total: counts.length, share: occupied / counts.length };
}

/** The coverage accumulator of one input format; inputs must already be checked (the scorer does). */
export class VectorCoverage {
  readonly cells: Float64Array;
  readonly sectors: Float64Array;
  readonly rings: Float64Array;
  zeroVectors = 0;
  distinct = 0;
  private readonly seen: Uint8Array | null;
  private readonly min: number;
  private readonly span: number;

  constructor(
    readonly config: Pick<VectorConfig, 'inBits'>,
    readonly options: Readonly<VectorCoverageOptions> = DEFAULT_VECTOR_COVERAGE,
  ) {
    for (const [key, v] of Object.entries(options)) {
      if (!Number.isInteger(v) || v < 1 || v > 1024) throw new RangeError(`coverage ${key}: must be a whole number 1..1024, got ${v}`);
    }
    const r = inputRange(config);
    this.min = r.min;
    this.span = r.max - r.min + 1;
    this.cells = new Float64Array(options.cellsPerAxis * options.cellsPerAxis);
    this.sectors = new Float64Array(options.sectors);
    this.rings = new Float64Array(options.rings);
    this.seen = 2 * config.inBits <= DISTINCT_MAX_BITS ? new Uint8Array(Math.ceil(this.span ** 2 / 8)) : null;
  }

  /** Counts the pairs xs[0..n), ys[0..n). */
  addAll(xs: ArrayLike<number>, ys: ArrayLike<number>, n: number): void {
    const { min, span, cells, sectors, rings, seen } = this;
    const perAxis = this.options.cellsPerAxis;
    const cellScale = perAxis / span;
    const sectorScale = sectors.length / (2 * Math.PI);
    const ringScale = rings.length / (Math.SQRT2 * (span / 2));
    for (let k = 0; k < n; k++) {
      const x = xs[k];
      const y = ys[k];
      const dx = x - min;
      const dy = y - min;
      cells[Math.floor(dy * cellScale) * perAxis + Math.floor(dx * cellScale)]++;
      if (x === 0 && y === 0) {
        this.zeroVectors++;
      } else {
        let a = Math.atan2(y, x);
        if (a < 0) a += 2 * Math.PI;
        sectors[Math.min(sectors.length - 1, Math.floor(a * sectorScale))]++;
      }
      rings[Math.min(rings.length - 1, Math.floor(Math.sqrt(x * x + y * y) * ringScale))]++;
      if (seen) {
        const at = dx * span + dy; // below 2^24: the bit arithmetic is exact
        const mask = 1 << (at & 7);
        if ((seen[at >>> 3] & mask) === 0) {
          seen[at >>> 3] |= mask;
          this.distinct++;
        }
      }
    }
  }

  /** Folds another coverage of the same format and options into this one. */
  merge(o: VectorCoverage): this {
    if (o.span !== this.span || JSON.stringify(o.options) !== JSON.stringify(this.options)) throw new RangeError('coverage: cannot merge different formats or divisions');
    const add = (a: Float64Array, b: Float64Array) => b.forEach((v, i) => (a[i] += v));
    add(this.cells, o.cells);
    add(this.sectors, o.sectors);
    add(this.rings, o.rings);
    this.zeroVectors += o.zeroVectors;
    if (this.seen && o.seen) {
      for (let i = 0; i < this.seen.length; i++) {
        let fresh = o.seen[i] & ~this.seen[i];
        this.seen[i] |= fresh;
        for (; fresh; fresh &= fresh - 1) this.distinct++;
      }
    }
    return this;
  }

  summary(): VectorCoverageSummary {
    return {
      cellsPerAxis: this.options.cellsPerAxis,
      cells: occupancy(this.cells),
      sectors: occupancy(this.sectors),
      rings: occupancy(this.rings),
      zeroVectors: this.zeroVectors,
      distinct: this.seen ? this.distinct : null,
      total: this.span ** 2,
    };
  }
}
