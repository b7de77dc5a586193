// What each signal chart shows, apart from where its data comes from: the Bench page feeds them
// live, the Session page from stored samples. Data is columnar, as uPlot takes it:
//   values     [angle°, exact cos, cos, exact sin, sin]
//   error      [angle°, cos error LSB, sin error LSB]
//   errorCos   [angle°, cos error LSB]       errorSin [angle°, sin error LSB]
//   histogram  [bin centre LSB, cos count, sin count]
//   xy         [cos ascending, sin]
//   soakByPass [pass, model mismatches, unstable codes so far, link errors, re-asked]
//   soakByTime [minutes into the soak, the same four]
// and for vectoring cores (vector-plot-data.ts):
//   angleError [direction°, angle error LSB]   magnitudeError [input magnitude, magnitude error LSB]
//   vectorHistogram [bin centre LSB, angle count, magnitude count]
import uPlot from 'uplot';
import { axis, dots, FAIL, INK, line, REFERENCE, SIGNAL } from './uplot-theme';

export type ChartId = 'values' | 'error' | 'errorCos' | 'errorSin' | 'histogram' | 'xy' | 'soakByPass' | 'soakByTime' | 'angleError' | 'magnitudeError' | 'vectorHistogram';

export interface ChartSpec {
  title: string;
  testId: string;
  options: Omit<uPlot.Options, 'width' | 'height'>;
}

/** Counts to a million and beyond fit the axis: 250k, 1.2M. */
export const compactCount = (v: number) => (Math.abs(v) >= 1e6 ? `${+(v / 1e6).toFixed(1)}M` : Math.abs(v) >= 1e4 ? `${+(v / 1e3).toFixed(0)}k` : v.toLocaleString('en-US'));
const countAxis = (): uPlot.Axis => ({ ...axis('count'), values: (_u, splits) => splits.map(compactCount) });

/** Whole passes only on the pass axis: steps of 1, 2, 5, 10 … */
const PASS_STEPS = Array.from({ length: 7 }, (_, e) => [1, 2, 5].map((m) => m * 10 ** e)).flat();
const soakSeries = (): uPlot.Series[] => [{}, line(FAIL, 'model mismatches', 2), line(SIGNAL, 'unstable codes so far', 2), line(REFERENCE, 'link errors', 2), line(INK, 're-asked', 1)];

const bars = (align: -1 | 1) => uPlot.paths.bars!({ size: [0.45, Infinity], align });

export const CHART_SPECS: Record<ChartId, ChartSpec> = {
  values: {
    title: 'Returned against exact',
    testId: 'chart-values',
    options: { scales: { x: { time: false } }, axes: [axis('angle, °'), axis()], series: [{}, line(REFERENCE, 'exact cos'), dots(SIGNAL, 'cos'), line(INK, 'exact sin'), dots(FAIL, 'sin')] },
  },
  error: {
    title: 'Error against angle, LSB',
    testId: 'chart-error',
    options: { scales: { x: { time: false } }, axes: [axis('angle, °'), axis('LSB')], series: [{}, dots(SIGNAL, 'cos error'), dots(REFERENCE, 'sin error')] },
  },
  errorCos: {
    title: 'cos error against angle, LSB',
    testId: 'chart-error-cos',
    options: { scales: { x: { time: false } }, axes: [axis('angle, °'), axis('LSB')], series: [{}, dots(SIGNAL, 'cos error')] },
  },
  errorSin: {
    title: 'sin error against angle, LSB',
    testId: 'chart-error-sin',
    options: { scales: { x: { time: false } }, axes: [axis('angle, °'), axis('LSB')], series: [{}, dots(REFERENCE, 'sin error')] },
  },
  histogram: {
    title: 'Error histogram',
    testId: 'chart-histogram',
    options: {
      scales: { x: { time: false } },
      axes: [axis('error, LSB'), countAxis()],
      series: [{}, { label: 'cos', stroke: SIGNAL, fill: SIGNAL + '88', paths: bars(-1) }, { label: 'sin', stroke: REFERENCE, fill: REFERENCE + '88', paths: bars(1) }],
    },
  },
  soakByPass: {
    title: 'Soak timeline, per pass',
    testId: 'chart-soak',
    options: { scales: { x: { time: false } }, axes: [{ ...axis('pass'), incrs: PASS_STEPS }, countAxis()], series: soakSeries() },
  },
  soakByTime: {
    title: 'Soak timeline, against time',
    testId: 'chart-soak',
    options: { scales: { x: { time: false } }, axes: [axis('minutes into the soak'), countAxis()], series: soakSeries() },
  },
  angleError: {
    title: 'Angle error against direction, LSB',
    testId: 'chart-angle-error',
    options: { scales: { x: { time: false, range: [-180, 180] } }, axes: [axis('direction of (x, y), °'), axis('angle LSB')], series: [{}, dots(SIGNAL, 'angle error')] },
  },
  magnitudeError: {
    title: 'Magnitude error against magnitude, LSB',
    testId: 'chart-magnitude-error',
    options: { scales: { x: { time: false } }, axes: [axis('input magnitude |(x, y)|'), axis('magnitude LSB')], series: [{}, dots(REFERENCE, 'magnitude error')] },
  },
  vectorHistogram: {
    title: 'Error histogram, angle and magnitude',
    testId: 'chart-vector-histogram',
    options: {
      scales: { x: { time: false } },
      axes: [axis('error, LSB'), countAxis()],
      series: [{}, { label: 'angle', stroke: SIGNAL, fill: SIGNAL + '88', paths: bars(-1) }, { label: 'magnitude', stroke: REFERENCE, fill: REFERENCE + '88', paths: bars(1) }],
    },
  },
  xy: {
    title: 'XY circle (sin against cos)',
    testId: 'chart-xy',
    // Ranges are set by SignalCharts: one extent for both scales, so a circle stays round. Fixed
    // padding (top = right) with equal axis sizes makes a square canvas a square plotting area.
    options: { padding: [12, 12, 0, 0], scales: { x: { time: false }, y: {} }, axes: [axis('cos'), axis('sin')], series: [{}, dots(SIGNAL, 'sin vs cos')], cursor: { show: false } },
  },
};

/** Half-width of both XY scales: the unit circle with a margin, or wider if the data is. */
export function xyExtent(data: uPlot.AlignedData): number {
  let m = 1;
  for (const col of data) {
    for (let i = 0; i < col.length; i++) {
      const v = col[i];
      if (typeof v === 'number' && Number.isFinite(v) && Math.abs(v) > m) m = Math.abs(v);
    }
  }
  return m * 1.1;
}

/** Centres of the histogram's bins (edgesLsb holds each bin's left edge). */
export function histogramData(h: { edgesLsb: number[]; binsPerLsb: number; cos: number[]; sin: number[] } | null | undefined): uPlot.AlignedData {
  if (!h) return [[], [], []];
  return [h.cos.map((_, i) => h.edgesLsb[i] + 0.5 / h.binsPerLsb), h.cos, h.sin];
}
