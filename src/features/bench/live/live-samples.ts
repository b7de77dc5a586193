// Where live results go on their way to the charts: never React state. The first RAW_LIMIT samples
// are kept as they are; past that, every chart column keeps only its min and max, so a run of
// millions of results costs a fixed amount of memory and drawing.
import { angleCodeRange, angleCodeToDegrees, type ModelConfig, type ScoreSummary } from '../../../../shared/numeric';

export const RAW_LIMIT = 4096;
export const COLUMNS = 1600;

type Series = 'cos' | 'sin' | 'errCos' | 'errSin';
const SERIES: Series[] = ['cos', 'sin', 'errCos', 'errSin'];

export class LiveSamples {
  /** Bumped on every change; the chart loop draws when it moves. */
  version = 0;
  count = 0;
  summary: ScoreSummary | null = null;
  summaryVersion = 0;
  readonly xMinDeg: number;
  readonly xMaxDeg: number;
  readonly scale: number;
  readonly raw = { x: new Float64Array(RAW_LIMIT), cos: new Float64Array(RAW_LIMIT), sin: new Float64Array(RAW_LIMIT), errCos: new Float64Array(RAW_LIMIT), errSin: new Float64Array(RAW_LIMIT) };
  readonly min: Record<Series, Float64Array>;
  readonly max: Record<Series, Float64Array>;
  readonly filled = new Uint8Array(COLUMNS);
  /** Degrees of a code, as angleCodeToDegrees works them out, without its per-call range check (the worker scored every code). */
  private readonly degrees: (code: number) => number;

  constructor(readonly config: ModelConfig) {
    const r = angleCodeRange(config);
    this.xMinDeg = angleCodeToDegrees(config, r.min);
    this.xMaxDeg = angleCodeToDegrees(config, r.max);
    this.scale = 2 ** -config.outFrac;
    const make = (fill: number) => Object.fromEntries(SERIES.map((s) => [s, new Float64Array(COLUMNS).fill(fill)])) as Record<Series, Float64Array>;
    this.min = make(Infinity);
    this.max = make(-Infinity);
    // The same expressions, in the same order, as angleCodeToDegrees: the same doubles.
    const turn = 2 ** config.angleBits;
    const rad = 2 ** config.angleFrac;
    this.degrees = config.angleFormat === 'turn' ? (code) => (360 * code) / turn : (code) => ((code / rad) * 180) / Math.PI;
  }

  /** x of a column's centre, degrees. */
  columnX(c: number) {
    return this.xMinDeg + ((c + 0.5) / COLUMNS) * (this.xMaxDeg - this.xMinDeg);
  }

  add(codes: Float64Array, cos: Int32Array, sin: Int32Array, errCos: Float32Array, errSin: Float32Array) {
    const span = this.xMaxDeg - this.xMinDeg || 1;
    const { xMinDeg, scale, degrees, raw, filled } = this;
    // One loop over typed arrays, no object per sample: this runs for every result of a run.
    const [minCos, minSin, minErrCos, minErrSin] = [this.min.cos, this.min.sin, this.min.errCos, this.min.errSin];
    const [maxCos, maxSin, maxErrCos, maxErrSin] = [this.max.cos, this.max.sin, this.max.errCos, this.max.errSin];
    let count = this.count;
    for (let k = 0; k < codes.length; k++) {
      const x = degrees(codes[k]);
      const vc = cos[k] * scale;
      const vs = sin[k] * scale;
      const ec = errCos[k];
      const es = errSin[k];
      if (count < RAW_LIMIT) {
        raw.x[count] = x;
        raw.cos[count] = vc;
        raw.sin[count] = vs;
        raw.errCos[count] = ec;
        raw.errSin[count] = es;
      }
      const c = Math.min(COLUMNS - 1, Math.max(0, Math.floor(((x - xMinDeg) / span) * COLUMNS)));
      filled[c] = 1;
      if (vc < minCos[c]) minCos[c] = vc;
      if (vc > maxCos[c]) maxCos[c] = vc;
      if (vs < minSin[c]) minSin[c] = vs;
      if (vs > maxSin[c]) maxSin[c] = vs;
      if (ec < minErrCos[c]) minErrCos[c] = ec;
      if (ec > maxErrCos[c]) maxErrCos[c] = ec;
      if (es < minErrSin[c]) minErrSin[c] = es;
      if (es > maxErrSin[c]) maxErrSin[c] = es;
      count++;
    }
    this.count = count;
    this.version++;
  }

  setSummary(s: ScoreSummary) {
    this.summary = s;
    this.summaryVersion++;
  }
}
