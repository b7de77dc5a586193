// The board's answers less two models' (the best hypothesis's and the declared model's), against
// angle, as chart data: every sample while there are few, else the lowest and highest difference
// of each pixel column, so a million samples cost a fixed amount to draw. Also which codes are
// worth tracing: where the hypothesis and the declared model give different answers.
import type uPlot from 'uplot';
import { angleCodeToDegrees, type CosSin, type ModelConfig } from '../../../../shared/numeric';

export const RAW_LIMIT = 4096;
export const COLUMNS = 1200;
/** How many codes of each kind the trace chooser offers. */
export const CHOICES = 24;

export interface DiffCurves {
  /** [angle°, cos board − hypothesis, sin board − hypothesis] in LSB. */
  hypothesis: uPlot.AlignedData;
  /** [angle°, cos board − declared, sin board − declared] in LSB. */
  declared: uPlot.AlignedData;
  /** Answered codes (lowest first) where the hypothesis and the declared model differ. */
  partingCodes: number[];
  /** Answered codes (lowest first) the hypothesis does not reproduce. */
  unexplainedCodes: number[];
}

interface Evaluator {
  evaluate(code: number): CosSin;
}

export function diffCurves(
  config: ModelConfig,
  samples: { codes: ArrayLike<number>; cos: ArrayLike<number>; sin: ArrayLike<number> },
  hypothesis: Evaluator,
  declared: Evaluator,
  columns = COLUMNS,
): DiffCurves {
  const n = samples.codes.length;
  const x = new Float64Array(n);
  const series = Array.from({ length: 4 }, () => new Float64Array(n));
  const parting: number[] = [];
  const unexplained: number[] = [];
  for (let k = 0; k < n; k++) {
    const code = samples.codes[k];
    const h = hypothesis.evaluate(code);
    const d = declared.evaluate(code);
    x[k] = angleCodeToDegrees(config, code);
    series[0][k] = samples.cos[k] - h.cos;
    series[1][k] = samples.sin[k] - h.sin;
    series[2][k] = samples.cos[k] - d.cos;
    series[3][k] = samples.sin[k] - d.sin;
    if (h.cos !== d.cos || h.sin !== d.sin) parting.push(code);
    if (series[0][k] !== 0 || series[1][k] !== 0) unexplained.push(code);
  }
  const lowest = (codes: number[]) => [...new Set(codes)].sort((a, b) => a - b).slice(0, CHOICES);
  const [hx, hc, hs] = reduce(x, series[0], series[1], n <= RAW_LIMIT ? 0 : columns);
  const [dx, dc, ds] = reduce(x, series[2], series[3], n <= RAW_LIMIT ? 0 : columns);
  return { hypothesis: [hx, hc, hs], declared: [dx, dc, ds], partingCodes: lowest(parting), unexplainedCodes: lowest(unexplained) };
}

/** In angle order; with `columns`, each filled column gives two points: its lowest and highest value. */
function reduce(x: Float64Array, a: Float64Array, b: Float64Array, columns: number): [Float64Array, Float64Array, Float64Array] {
  const order = Array.from(x.keys()).sort((i, j) => x[i] - x[j]);
  if (columns === 0) return [Float64Array.from(order, (i) => x[i]), Float64Array.from(order, (i) => a[i]), Float64Array.from(order, (i) => b[i])];
  if (order.length === 0) return [new Float64Array(0), new Float64Array(0), new Float64Array(0)];
  const lo = x[order[0]];
  const span = x[order[order.length - 1]] - lo || 1;
  const col = (v: number) => Math.min(columns - 1, Math.floor(((v - lo) / span) * columns));
  const min = [new Float64Array(columns).fill(Infinity), new Float64Array(columns).fill(Infinity)];
  const max = [new Float64Array(columns).fill(-Infinity), new Float64Array(columns).fill(-Infinity)];
  for (const i of order) {
    const c = col(x[i]);
    [a[i], b[i]].forEach((v, s) => {
      if (v < min[s][c]) min[s][c] = v;
      if (v > max[s][c]) max[s][c] = v;
    });
  }
  const used = Array.from({ length: columns }, (_, c) => c).filter((c) => min[0][c] !== Infinity);
  const outX = new Float64Array(2 * used.length);
  const outA = new Float64Array(2 * used.length);
  const outB = new Float64Array(2 * used.length);
  used.forEach((c, j) => {
    outX[2 * j] = outX[2 * j + 1] = lo + ((c + 0.5) / columns) * span;
    [outA[2 * j], outA[2 * j + 1]] = [min[0][c], max[0][c]];
    [outB[2 * j], outB[2 * j + 1]] = [min[1][c], max[1][c]];
  });
  return [outX, outA, outB];
}
