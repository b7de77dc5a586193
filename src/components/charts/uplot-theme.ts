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
 * Dots as small filled squares, one rectangle each in a single path: a canvas fills thousands of
 * rectangles in the time it takes to trace as many circles, and at 3 px the two look alike.
 */
const squareDots: uPlot.Series.Points.PathBuilder = (u, seriesIdx, idx0, idx1) => {
  const xs = u.data[0];
  const ys = u.data[seriesIdx];
  const scale = u.series[seriesIdx].scale ?? 'y';
  const side = DOT * devicePixelRatio;
  const fill = new Path2D();
  for (let i = idx0; i <= idx1; i++) {
    const y = ys[i];
    if (y == null) continue;
    const px = Math.round(u.valToPos(xs[i], 'x', true) - side / 2);
    const py = Math.round(u.valToPos(y, scale, true) - side / 2);
    fill.rect(px, py, side, side);
  }
  return { fill, stroke: null };
};

export const dots = (stroke: string, label: string): uPlot.Series => ({ label, stroke, width: 0, paths: () => null, points: { show: true, size: DOT, width: 0, stroke, fill: stroke, paths: squareDots } });
export const line = (stroke: string, label: string, width = 1): uPlot.Series => ({ label, stroke, width });
