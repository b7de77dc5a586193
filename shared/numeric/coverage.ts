// Which angle codes a session has covered, overall and per octant of the circle. Exact for every
// format: a bit set up to 24-bit angles (2 MiB), a set of codes beyond (a 32-bit exhaustive run
// is hours on any UART, so large sessions stay sparse).
import { angleCodeRange, type AngleFormat } from './formats';

const BITSET_MAX_BITS = 24;
/** How many bits are set in each byte value. */
const BITS_SET = Uint8Array.from({ length: 256 }, (_, b) => {
  let n = 0;
  for (let v = b; v !== 0; v &= v - 1) n++;
  return n;
});
const TWO_PI = 2 * Math.PI;

/** The octant 0..7 of the circle an angle code falls in (angle mod 2π, in steps of π/4). */
export function octantOfCode(f: AngleFormat, code: number): number {
  if (f.angleFormat === 'turn') return Math.floor((code * 8) / 2 ** f.angleBits);
  const rad = code / 2 ** f.angleFrac;
  const t = rad / TWO_PI;
  const o = Math.floor((t - Math.floor(t)) * 8);
  return o === 8 ? 0 : o;
}

const octantSizeCache = new Map<string, readonly number[]>();

/**
 * How many codes of the format fall in each octant. Exact for `turn`; for `rad` counted by
 * classifying every code (so it agrees with octantOfCode), or an even split past 2^24 codes.
 */
export function codesPerOctant(f: AngleFormat): readonly number[] {
  const key = `${f.angleFormat}/${f.angleBits}/${f.angleFrac}`;
  const hit = octantSizeCache.get(key);
  if (hit) return hit;
  const r = angleCodeRange(f);
  let sizes: number[];
  if (f.angleFormat === 'turn') {
    sizes = Array.from({ length: 8 }, (_, o) => Math.ceil(((o + 1) * r.count) / 8) - Math.ceil((o * r.count) / 8));
  } else if (f.angleBits <= BITSET_MAX_BITS) {
    sizes = new Array<number>(8).fill(0);
    for (let k = r.min; k <= r.max; k++) sizes[octantOfCode(f, k)]++;
  } else {
    sizes = new Array<number>(8).fill(r.count / 8);
  }
  octantSizeCache.set(key, sizes);
  return sizes;
}

/** Share of the codes covered, overall and per octant. */
export interface CoverageSummary {
  distinct: number;
  total: number;
  share: number;
  octants: { distinct: number; total: number; share: number }[];
}

/** The set of angle codes seen so far. */
export class CodeCoverage {
  private readonly bits: Uint8Array | null;
  private readonly sparse: Set<number> | null;
  private readonly min: number;
  /** octantOfCode with the power of two hoisted for `turn` (exact: 8 / 2^bits is a power of two). */
  private readonly octantOf: (code: number) => number;
  /**
   * Codes seen per octant, counted as they come; null where summary() counts them in the bit set
   * instead (`turn` from 6 bits up: each octant is then a run of whole bytes), which spares the
   * scorer's loop an octant and a count per new code.
   */
  private readonly perOctant: Float64Array | null;
  distinct = 0;

  constructor(readonly format: AngleFormat) {
    this.min = angleCodeRange(format).min;
    const eighths = 8 / 2 ** format.angleBits;
    this.octantOf = format.angleFormat === 'turn' ? (code) => Math.floor(code * eighths) : (code) => octantOfCode(format, code);
    const useBits = format.angleBits <= BITSET_MAX_BITS;
    this.bits = useBits ? new Uint8Array(Math.ceil(2 ** format.angleBits / 8)) : null;
    this.sparse = useBits ? null : new Set<number>();
    this.perOctant = useBits && format.angleFormat === 'turn' && format.angleBits >= 6 ? null : new Float64Array(8);
  }

  /** Marks one code as seen; the code must be in the format (the scorer checks it). */
  add(code: number): void {
    if (this.bits) {
      const at = code - this.min;
      const byte = Math.floor(at / 8);
      const mask = 1 << (at % 8);
      if (this.bits[byte] & mask) return;
      this.bits[byte] |= mask;
    } else {
      if (this.sparse!.has(code)) return;
      this.sparse!.add(code);
    }
    this.distinct++;
    if (this.perOctant) this.perOctant[this.octantOf(code)]++;
  }

  /** Marks codes[0..n) as seen: add() per code, with the bit set's arithmetic in integers. */
  addAll(codes: ArrayLike<number>, n: number): void {
    const bits = this.bits;
    if (!bits) {
      for (let k = 0; k < n; k++) this.add(codes[k]);
      return;
    }
    const { min, perOctant, octantOf } = this;
    let distinct = this.distinct;
    for (let k = 0; k < n; k++) {
      const code = codes[k];
      const at = code - min; // below 2^24, so the shifts are exact
      const byte = at >>> 3;
      const mask = 1 << (at & 7);
      const b = bits[byte];
      if (b & mask) continue;
      bits[byte] = b | mask;
      distinct++;
      if (perOctant) perOctant[octantOf(code)]++;
    }
    this.distinct = distinct;
  }

  /** Codes seen per octant: counted as they came, or now in the bit set. */
  private octantCounts(): ArrayLike<number> {
    if (this.perOctant) return this.perOctant;
    const bits = this.bits!;
    const bytesPerOctant = bits.length / 8; // whole: `turn` with at least 6 bits
    return Array.from({ length: 8 }, (_, o) => {
      let n = 0;
      for (let i = o * bytesPerOctant, end = i + bytesPerOctant; i < end; i++) n += BITS_SET[bits[i]];
      return n;
    });
  }

  /** True when the code has been seen. */
  has(code: number): boolean {
    if (this.bits) {
      const at = code - this.min;
      return (this.bits[Math.floor(at / 8)] & (1 << (at % 8))) !== 0;
    }
    return this.sparse!.has(code);
  }

  /** Folds another coverage of the same format into this one. */
  merge(o: CodeCoverage): this {
    if (this.bits && o.bits) {
      for (let i = 0; i < this.bits.length; i++) {
        const fresh = o.bits[i] & ~this.bits[i];
        if (fresh === 0) continue;
        for (let b = 0; b < 8; b++) if (fresh & (1 << b)) this.add(this.min + i * 8 + b);
      }
    } else {
      for (const code of o.sparse!) this.add(code);
    }
    return this;
  }

  /** Shares of all codes and of each octant's codes covered. */
  summary(): CoverageSummary {
    const total = 2 ** this.format.angleBits;
    const sizes = codesPerOctant(this.format);
    const perOctant = this.octantCounts();
    return {
      distinct: this.distinct,
      total,
      share: this.distinct / total,
      octants: sizes.map((size, o) => ({
        distinct: perOctant[o],
        total: size,
        share: size === 0 ? 1 : Math.min(1, perOctant[o] / size),
      })),
    };
  }
}
