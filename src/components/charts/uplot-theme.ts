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
export const dots = (stroke: string, label: string): uPlot.Series => ({ label, stroke, width: 0, paths: () => null, points: { show: true, size: 3, stroke, fill: stroke } });
export const line = (stroke: string, label: string, width = 1): uPlot.Series => ({ label, stroke, width });
