// Columnar data for the compare charts. Sessions of different cores can have different angle
// bins, so each session's points are placed on the union of all x values (uPlot wants one x
// column); a repeated x within one series (the low and high point of a bin) keeps its own row.
import type uPlot from 'uplot';
import type { ComparedPair, ComparedSession } from '../api/compare-types';

export interface XY {
  x: number[];
  y: (number | null)[];
}

/** One x column and one y column per series, rows sorted by x (then by repeat within a series). */
export function alignSeries(series: XY[]): uPlot.AlignedData {
  const rows = new Map<string, { x: number; k: number }>();
  const keysOf = series.map((s) => {
    const seen = new Map<number, number>();
    return s.x.map((x) => {
      const k = seen.get(x) ?? 0;
      seen.set(x, k + 1);
      const key = `${x}#${k}`;
      if (!rows.has(key)) rows.set(key, { x, k });
      return key;
    });
  });
  const ordered = [...rows.entries()].sort((p, q) => p[1].x - q[1].x || p[1].k - q[1].k);
  const index = new Map(ordered.map(([key], i) => [key, i]));
  const xs = ordered.map(([, r]) => r.x);
  const ys = series.map((s, j) => {
    const col: (number | null)[] = new Array(xs.length).fill(null);
    keysOf[j].forEach((key, i) => (col[index.get(key)!] = s.y[i]));
    return col;
  });
  return [xs, ...ys] as uPlot.AlignedData;
}

/** The highest and the lowest error of each bin, as two lines the chart fills between. */
export function envelopeSeries(s: ComparedSession): [hi: XY, lo: XY] {
  const e = s.errorEnvelope;
  return [
    { x: e.degrees, y: e.hi },
    { x: e.degrees, y: e.lo },
  ];
}

/** Share of answers (cos and sin together) per histogram bin, in percent, at each bin's left edge. */
export function histogramSeries(s: ComparedSession): XY {
  const h = s.histogram;
  if (!h) return { x: [], y: [] };
  const total = h.counts.reduce((a, b) => a + b, 0) + h.below + h.above;
  return { x: h.edgesLsb, y: h.counts.map((c) => (total ? (100 * c) / total : 0)) };
}

/** The largest |Δ| of each bin where codes differ, at the bin's angle (from the first session). */
export function diffSeries(pair: ComparedPair, first: ComparedSession): XY {
  const x: number[] = [];
  const y: number[] = [];
  pair.byBin.differing.forEach((n, b) => {
    if (n === 0) return;
    x.push(first.errorEnvelope.degrees[b]);
    y.push(pair.byBin.maxAbsDiffLsb[b]);
  });
  return { x, y };
}

/** "#12 · ref16-r2" */
export const sessionName = (s: Pick<ComparedSession, 'id' | 'build'>) => `#${s.id}${s.build ? ` · ${s.build.label}` : ''}`;
