// The compare charts' look: one colour per session, in the order the sessions were chosen, and
// the axes of the rest of the app.
import type uPlot from 'uplot';

const INK = '#1f2a2e';
const RULE = '#d9d2c3';
const FONT = '12px "JetBrains Mono", monospace';

export const SESSION_COLOURS = ['#1f2a2e', '#c9821e', '#2f8b82', '#7b4fa0', '#a8402f', '#3b7d3a'];
export const colourOf = (index: number) => SESSION_COLOURS[index % SESSION_COLOURS.length];

export const axis = (label: string): uPlot.Axis => ({
  stroke: INK,
  font: FONT,
  labelFont: '13px "Atkinson Hyperlegible", sans-serif',
  grid: { stroke: RULE, width: 1 },
  ticks: { stroke: RULE },
  label,
  size: 58,
});

/** The charts drawn against angle share one cursor. */
export const ANGLE_SYNC = 'compare-angle';
