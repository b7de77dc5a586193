// Chart data from a stored session's samples, for any count: up to RAW_LIMIT samples are drawn
// as they are (in angle order); past that, every pixel column keeps its min and max, so a
// 1,048,576-sample session draws as about 2 × COLUMNS points and costs fixed memory.
import type uPlot from 'uplot';
import { angleCodeRange, angleCodeToDegrees, type ModelConfig } from '../../../../shared/numeric';

export const RAW_LIMIT = 4096;
export const COLUMNS = 1600;

type Series = 'cos' | 'sin' | 'errCos' | 'errSin';
const SERIES: Series[] = ['cos', 'sin', 'errCos', 'errSin'];

export interface StoredChartData {
  values: uPlot.AlignedData;
  errorCos: uPlot.AlignedData;
  errorSin: uPlot.AlignedData;
  error: uPlot.AlignedData;
  xy: uPlot.AlignedData;
}

const deg = (d: number) => (d * Math.PI) / 180;

export class PlotBuilder {
  readonly raw: boolean;
  private readonly xMin: number;
  private readonly span: number;
  private readonly scale: number;
  private count = 0;
  // Raw mode: every sample. Column mode: min/max per column, and the worst sample's (cos, sin).
  private readonly rx: Float64Array;
  private readonly rv: Record<Series, Float64Array>;
  private readonly min: Record<Series, Float64Array>;
  private readonly max: Record<Series, Float64Array>;
  private readonly worst: Float64Array;
  private readonly worstCos: Float64Array;
  private readonly worstSin: Float64Array;
  private readonly filled: Uint8Array;

  constructor(
    private readonly config: ModelConfig,
    total: number,
    readonly columns = COLUMNS,
  ) {
    this.raw = total <= RAW_LIMIT;
    const r = angleCodeRange(config);
    this.xMin = angleCodeToDegrees(config, r.min);
    this.span = angleCodeToDegrees(config, r.max) - this.xMin || 1;
    this.scale = 2 ** -config.outFrac;
    const n = this.raw ? total : 0;
    const c = this.raw ? 0 : columns;
    const make = (len: number, fill: number) => Object.fromEntries(SERIES.map((s) => [s, new Float64Array(len).fill(fill)])) as Record<Series, Float64Array>;
    this.rx = new Float64Array(n);
    this.rv = make(n, 0);
    this.min = make(c, Infinity);
    this.max = make(c, -Infinity);
    this.worst = new Float64Array(c).fill(-1);
    this.worstCos = new Float64Array(c);
    this.worstSin = new Float64Array(c);
    this.filled = new Uint8Array(c);
  }

  /** x of a column's centre, degrees. */
  columnX(c: number): number {
    return this.xMin + ((c + 0.5) / this.columns) * this.span;
  }

  /** Adds a chunk; `errCos`/`errSin` are errors against exact math in LSB. */
  add(codes: ArrayLike<number>, cos: ArrayLike<number>, sin: ArrayLike<number>, errCos: ArrayLike<number>, errSin: ArrayLike<number>): void {
    for (let k = 0; k < codes.length; k++) {
      const x = angleCodeToDegrees(this.config, codes[k]);
      const v = { cos: cos[k] * this.scale, sin: sin[k] * this.scale, errCos: errCos[k], errSin: errSin[k] };
      if (this.raw) {
        const i = this.count;
        if (i >= this.rx.length) throw new RangeError(`more samples than the ${this.rx.length} announced`);
        this.rx[i] = x;
        for (const s of SERIES) this.rv[s][i] = v[s];
      } else {
        const c = Math.min(this.columns - 1, Math.max(0, Math.floor(((x - this.xMin) / this.span) * this.columns)));
        this.filled[c] = 1;
        for (const s of SERIES) {
          if (v[s] < this.min[s][c]) this.min[s][c] = v[s];
          if (v[s] > this.max[s][c]) this.max[s][c] = v[s];
        }
        // The XY circle keeps, per column, the answer that strays furthest, so a fault shows.
        const w = Math.max(Math.abs(v.errCos), Math.abs(v.errSin));
        if (w > this.worst[c]) {
          this.worst[c] = w;
          this.worstCos[c] = v.cos;
          this.worstSin[c] = v.sin;
        }
      }
      this.count++;
    }
  }

  build(): StoredChartData {
    return this.raw ? this.buildRaw() : this.buildColumns();
  }

  private buildRaw(): StoredChartData {
    const n = this.count;
    const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => this.rx[a] - this.rx[b]);
    const pick = (a: Float64Array) => Float64Array.from(order, (i) => a[i]);
    const x = pick(this.rx);
    const cos = pick(this.rv.cos);
    const sin = pick(this.rv.sin);
    const errCos = pick(this.rv.errCos);
    const errSin = pick(this.rv.errSin);
    return {
      values: [x, x.map((d) => Math.cos(deg(d))), cos, x.map((d) => Math.sin(deg(d))), sin],
      errorCos: [x, errCos],
      errorSin: [x, errSin],
      error: [x, errCos, errSin],
      xy: xySorted(cos, sin),
    };
  }

  private buildColumns(): StoredChartData {
    const used: number[] = [];
    for (let c = 0; c < this.columns; c++) if (this.filled[c]) used.push(c);
    const m = used.length;
    const x = new Float64Array(2 * m);
    const pair = (s: Series) => {
      const out = new Float64Array(2 * m);
      used.forEach((c, j) => {
        out[2 * j] = this.min[s][c];
        out[2 * j + 1] = this.max[s][c];
      });
      return out;
    };
    used.forEach((c, j) => (x[2 * j] = x[2 * j + 1] = this.columnX(c)));
    const errCos = pair('errCos');
    const errSin = pair('errSin');
    return {
      values: [x, x.map((d) => Math.cos(deg(d))), pair('cos'), x.map((d) => Math.sin(deg(d))), pair('sin')],
      errorCos: [x, errCos],
      errorSin: [x, errSin],
      error: [x, errCos, errSin],
      xy: xySorted(Float64Array.from(used, (c) => this.worstCos[c]), Float64Array.from(used, (c) => this.worstSin[c])),
    };
  }
}

/** uPlot wants x ascending: the XY points sorted by cos. */
function xySorted(cos: Float64Array, sin: Float64Array): uPlot.AlignedData {
  const order = Array.from({ length: cos.length }, (_, i) => i).sort((a, b) => cos[a] - cos[b]);
  return [Float64Array.from(order, (i) => cos[i]), Float64Array.from(order, (i) => sin[i])];
}
