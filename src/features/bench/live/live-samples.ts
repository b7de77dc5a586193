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

  constructor(readonly config: ModelConfig) {
    const r = angleCodeRange(config);
    this.xMinDeg = angleCodeToDegrees(config, r.min);
    this.xMaxDeg = angleCodeToDegrees(config, r.max);
    this.scale = 2 ** -config.outFrac;
    const make = (fill: number) => Object.fromEntries(SERIES.map((s) => [s, new Float64Array(COLUMNS).fill(fill)])) as Record<Series, Float64Array>;
    this.min = make(Infinity);
    this.max = make(-Infinity);
  }

  /** x of a column's centre, degrees. */
  columnX(c: number) {
    return this.xMinDeg + ((c + 0.5) / COLUMNS) * (this.xMaxDeg - this.xMinDeg);
  }

  add(codes: Float64Array, cos: Int32Array, sin: Int32Array, errCos: Float32Array, errSin: Float32Array) {
    const span = this.xMaxDeg - this.xMinDeg || 1;
    for (let k = 0; k < codes.length; k++) {
      const x = angleCodeToDegrees(this.config, codes[k]);
      const v = { cos: cos[k] * this.scale, sin: sin[k] * this.scale, errCos: errCos[k], errSin: errSin[k] };
      if (this.count < RAW_LIMIT) {
        const i = this.count;
        this.raw.x[i] = x;
        this.raw.cos[i] = v.cos;
        this.raw.sin[i] = v.sin;
        this.raw.errCos[i] = v.errCos;
        this.raw.errSin[i] = v.errSin;
      }
      const c = Math.min(COLUMNS - 1, Math.max(0, Math.floor(((x - this.xMinDeg) / span) * COLUMNS)));
      this.filled[c] = 1;
      for (const s of SERIES) {
        if (v[s] < this.min[s][c]) this.min[s][c] = v[s];
        if (v[s] > this.max[s][c]) this.max[s][c] = v[s];
      }
      this.count++;
    }
    this.version++;
  }

  setSummary(s: ScoreSummary) {
    this.summary = s;
    this.summaryVersion++;
  }
}
