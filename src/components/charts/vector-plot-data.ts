// What the vectoring charts show, built from scored answers without passing through React: the
// Bench page adds batches as they are scored, the Session page adds the stored samples once. The
// first RAW_POINTS answers are kept as they are; past that each chart column keeps its min and
// max, and the x–y map keeps the largest |error| per cell, so any run costs a fixed amount.
//   angleError      [direction of (x, y), °, angle error LSB]
//   magnitudeError  [input magnitude |(x, y)| in input units, magnitude error LSB]
//   vectorHistogram [bin centre LSB, angle count, magnitude count]
import type uPlot from 'uplot';
import { exactVectorInto, wrapAngleError, type VectorConfig } from '../../../shared/vectoring';

export const RAW_POINTS = 4096;
export const PLOT_COLUMNS = 1600;
/** Cells per side of the x–y error map. */
export const MAP_CELLS = 64;

/** The error map: the largest |error| per cell (−1: no answer there), row 0 at the bottom (lowest y). */
export interface ErrorMapData {
  cells: number;
  /** Input range each axis spans, in codes. */
  min: number;
  max: number;
  /** Input codes per unit (2^inFrac), to label the axes in input units. */
  scale: number;
  angle: Float32Array;
  magnitude: Float32Array;
}

export interface VectorCharts {
  angleError: uPlot.AlignedData;
  magnitudeError: uPlot.AlignedData;
  map: ErrorMapData;
}

/** The vectoring histograms as the chart takes them (VectorScoreSummary.histogram). */
export function vectorHistogramData(h: { edgesLsb: number[]; binsPerLsb: number; angle: number[]; magnitude: number[] } | null | undefined): uPlot.AlignedData {
  if (!h) return [[], [], []];
  return [h.angle.map((_, i) => h.edgesLsb[i] + 0.5 / h.binsPerLsb), h.angle, h.magnitude];
}

/**
 * Each answer's errors against the exact reference, in output LSB, as the scorer measures them:
 * the angle error wrapped at half a turn (NaN for the zero vector, which has no angle), the
 * magnitude error as it is. Scratch arrays are the caller's, at least `xs.length` long.
 */
export function vectorErrorsInto(
  c: VectorConfig,
  xs: ArrayLike<number>,
  ys: ArrayLike<number>,
  angles: ArrayLike<number>,
  magnitudes: ArrayLike<number>,
  scratch: { angle: Float64Array; magnitude: Float64Array },
  angleErr: Float32Array,
  magErr: Float32Array,
) {
  exactVectorInto(c, xs, ys, scratch.angle, scratch.magnitude);
  const period = c.angleFormat === 'turn' ? 2 ** c.angleBits : 2 * Math.PI * 2 ** c.angleFrac;
  for (let k = 0; k < xs.length; k++) {
    angleErr[k] = xs[k] === 0 && ys[k] === 0 ? NaN : wrapAngleError(angles[k] - scratch.angle[k], period);
    magErr[k] = magnitudes[k] - scratch.magnitude[k];
  }
}

class Columns {
  readonly min = new Float64Array(PLOT_COLUMNS).fill(Infinity);
  readonly max = new Float64Array(PLOT_COLUMNS).fill(-Infinity);
  constructor(
    readonly lo: number,
    readonly hi: number,
  ) {}
  add(x: number, v: number) {
    const c = Math.min(PLOT_COLUMNS - 1, Math.max(0, Math.floor(((x - this.lo) / (this.hi - this.lo)) * PLOT_COLUMNS)));
    if (v < this.min[c]) this.min[c] = v;
    if (v > this.max[c]) this.max[c] = v;
  }
  /** Two points (min, max) per filled column, at the column's centre. */
  data(): uPlot.AlignedData {
    const x: number[] = [];
    const y: number[] = [];
    for (let c = 0; c < PLOT_COLUMNS; c++) {
      if (this.min[c] > this.max[c]) continue;
      const cx = this.lo + ((c + 0.5) / PLOT_COLUMNS) * (this.hi - this.lo);
      x.push(cx, cx);
      y.push(this.min[c], this.max[c]);
    }
    return [x, y];
  }
}

/** Sorted by x: uPlot wants ascending x. */
function sortedPairs(x: Float64Array, y: Float64Array, n: number): uPlot.AlignedData {
  const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => x[a] - x[b]);
  return [order.map((i) => x[i]), order.map((i) => y[i])];
}

export class VectorPlotData {
  /** Bumped on every change; a chart loop redraws when it moves. */
  version = 0;
  count = 0;
  private readonly raw = { dir: new Float64Array(RAW_POINTS), angleErr: new Float64Array(RAW_POINTS), mag: new Float64Array(RAW_POINTS), magErr: new Float64Array(RAW_POINTS) };
  private rawAngle = 0;
  private readonly dirCols = new Columns(-180, 180);
  private readonly magCols: Columns;
  private readonly mapAngle = new Float32Array(MAP_CELLS * MAP_CELLS).fill(-1);
  private readonly mapMag = new Float32Array(MAP_CELLS * MAP_CELLS).fill(-1);
  private readonly min: number;
  private readonly span: number;
  private readonly scale: number;

  /** `inBits`, `inFrac`: the core's input format. */
  constructor(readonly format: { inBits: number; inFrac: number }) {
    this.min = -(2 ** (format.inBits - 1));
    this.span = 2 ** format.inBits;
    this.scale = 2 ** format.inFrac;
    // The largest input magnitude is the corner's, √2 · 2^(inBits−1) codes.
    this.magCols = new Columns(0, (Math.SQRT2 * 2 ** (format.inBits - 1)) / this.scale);
  }

  /**
   * Scored answers: inputs and their errors in LSB. The zero vector has no angle error (NaN is
   * passed for it, as for any answer without one) and shows only its magnitude error.
   */
  add(xs: ArrayLike<number>, ys: ArrayLike<number>, angleErr: ArrayLike<number>, magErr: ArrayLike<number>) {
    const { raw } = this;
    for (let k = 0; k < xs.length; k++) {
      const x = xs[k];
      const y = ys[k];
      const mag = Math.hypot(x, y) / this.scale;
      const ea = angleErr[k];
      const em = magErr[k];
      const hasAngle = Number.isFinite(ea);
      const dir = (Math.atan2(y, x) * 180) / Math.PI;
      if (this.count < RAW_POINTS) {
        raw.mag[this.count] = mag;
        raw.magErr[this.count] = em;
      }
      if (hasAngle && this.rawAngle < RAW_POINTS) {
        raw.dir[this.rawAngle] = dir;
        raw.angleErr[this.rawAngle++] = ea;
      }
      if (hasAngle) this.dirCols.add(dir, ea);
      this.magCols.add(mag, em);
      const cx = Math.min(MAP_CELLS - 1, Math.floor(((x - this.min) / this.span) * MAP_CELLS));
      const cy = Math.min(MAP_CELLS - 1, Math.floor(((y - this.min) / this.span) * MAP_CELLS));
      const cell = cy * MAP_CELLS + cx;
      if (hasAngle && Math.abs(ea) > this.mapAngle[cell]) this.mapAngle[cell] = Math.abs(ea);
      if (Math.abs(em) > this.mapMag[cell]) this.mapMag[cell] = Math.abs(em);
      this.count++;
    }
    this.version++;
  }

  /** The chart data as it stands; raw points while they all fit, column extremes after. */
  charts(): VectorCharts {
    const all = this.count <= RAW_POINTS;
    return {
      angleError: all ? sortedPairs(this.raw.dir, this.raw.angleErr, this.rawAngle) : this.dirCols.data(),
      magnitudeError: all ? sortedPairs(this.raw.mag, this.raw.magErr, this.count) : this.magCols.data(),
      map: { cells: MAP_CELLS, min: this.min, max: this.min + this.span - 1, scale: this.scale, angle: this.mapAngle.slice(), magnitude: this.mapMag.slice() },
    };
  }
}
