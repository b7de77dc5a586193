// The look every uPlot chart shares: the palette of src/index.css, mono tick labels, quiet grid.
import type uPlot from 'uplot';

export const INK = '#1f2a2e';
export const SIGNAL = '#c9821e';
export const REFERENCE = '#2f8b82';
export const FAIL = '#a8402f';
export const RULE = '#d9d2c3';

const FONT = '12px "JetBrains Mono", monospace';
const LABEL_FONT = '13px "Atkinson Hyperlegible", sans-serif';
/** Both axes take the same room, so a square canvas has a square plotting area. */
export const AXIS_SIZE = 58;

export const axis = (label?: string): uPlot.Axis => ({ stroke: INK, font: FONT, labelFont: LABEL_FONT, grid: { stroke: RULE, width: 1 }, ticks: { stroke: RULE }, label, size: AXIS_SIZE });
/** Diameter of a dot, CSS px. */
const DOT = 3;

/**
 * Dots as small filled squares in one path, merged per pixel column: the squares of one column
 * that touch or overlap become one rectangle covering the same pixels. A chart of thousands of
 * points (a stored session's hundreds of thousands) then fills about one rectangle per column
 * and distinct row, not a circle per point; at 3 px a square and a circle look alike.
 */
const squareDots: uPlot.Series.Points.PathBuilder = (u, seriesIdx, idx0, idx1) => {
  const xs = u.data[0];
  const ys = u.data[seriesIdx];
  const scale = u.series[seriesIdx].scale ?? 'y';
  const side = Math.max(1, Math.round(DOT * devicePixelRatio));
  const fill = new Path2D();
  // The column being gathered and its rows (top edges of the squares), emitted when it changes.
  let column = NaN;
  const tops: number[] = [];
  const emit = () => {
    if (tops.length === 0) return;
    tops.sort((a, b) => a - b);
    let from = tops[0];
    let to = from + side;
    for (let k = 1; k < tops.length; k++) {
      if (tops[k] <= to) to = Math.max(to, tops[k] + side);
      else {
        fill.rect(column, from, side, to - from);
        from = tops[k];
        to = from + side;
      }
    }
    fill.rect(column, from, side, to - from);
    tops.length = 0;
  };
  for (let i = idx0; i <= idx1; i++) {
    const y = ys[i];
    if (y == null) continue;
    const px = Math.round(u.valToPos(xs[i], 'x', true) - side / 2);
    if (px !== column) {
      emit();
      column = px;
    }
    tops.push(Math.round(u.valToPos(y, scale, true) - side / 2));
  }
  emit();
  return { fill, stroke: null };
};

export const dots = (stroke: string, label: string): uPlot.Series => ({ label, stroke, width: 0, paths: () => null, points: { show: true, size: DOT, width: 0, stroke, fill: stroke, paths: squareDots } });
export const line = (stroke: string, label: string, width = 1): uPlot.Series => ({ label, stroke, width });
