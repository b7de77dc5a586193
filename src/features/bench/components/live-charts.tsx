// The four live charts. Each uPlot is made once; one animation-frame loop feeds them from the
// LiveSamples store whenever it has moved, so results never pass through React state.
import { useEffect, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import { COLUMNS, RAW_LIMIT, type LiveSamples } from '../session/live-samples';
import { panel, panelTitle } from '../../../components/ui';

const INK = '#1f2a2e';
const SIGNAL = '#c9821e';
const REFERENCE = '#2f8b82';
const FAIL = '#a8402f';
const RULE = '#d9d2c3';
const FONT = '12px "JetBrains Mono", monospace';
const axis = (label?: string): uPlot.Axis => ({ stroke: INK, font: FONT, labelFont: '13px "Atkinson Hyperlegible", sans-serif', grid: { stroke: RULE, width: 1 }, ticks: { stroke: RULE }, label, size: 58 });
const dots = (stroke: string, label: string): uPlot.Series => ({ label, stroke, width: 0, paths: () => null, points: { show: true, size: 3, stroke, fill: stroke } });
const line = (stroke: string, label: string, width = 1): uPlot.Series => ({ label, stroke, width });

type Data = uPlot.AlignedData;

/** Sorted raw samples, or two points (min, max) per column once past RAW_LIMIT. */
function angleData(s: LiveSamples, ys: ('cos' | 'sin' | 'errCos' | 'errSin')[], exact: boolean): Data {
  if (s.count <= RAW_LIMIT) {
    const n = s.count;
    const order = Array.from({ length: n }, (_, i) => i).sort((a, b) => s.raw.x[a] - s.raw.x[b]);
    const x = order.map((i) => s.raw.x[i]);
    const cols = ys.map((k) => order.map((i) => s.raw[k][i]));
    if (!exact) return [x, ...cols];
    const rad = x.map((d) => (d * Math.PI) / 180);
    return [x, rad.map(Math.cos), cols[0], rad.map(Math.sin), cols[1]];
  }
  const x: number[] = [];
  const cols: (number | null)[][] = ys.map(() => []);
  for (let c = 0; c < COLUMNS; c++) {
    if (!s.filled[c]) continue;
    const cx = s.columnX(c);
    x.push(cx, cx);
    ys.forEach((k, j) => cols[j].push(s.min[k][c], s.max[k][c]));
  }
  if (!exact) return [x, ...cols];
  const rad = x.map((d) => (d * Math.PI) / 180);
  return [x, rad.map(Math.cos), cols[0], rad.map(Math.sin), cols[1]];
}

function xyData(s: LiveSamples): Data {
  let cos: number[];
  let sin: number[];
  if (s.count <= RAW_LIMIT) {
    cos = Array.from(s.raw.cos.subarray(0, s.count));
    sin = Array.from(s.raw.sin.subarray(0, s.count));
  } else {
    cos = [];
    sin = [];
    for (let c = 0; c < COLUMNS; c++) {
      if (!s.filled[c]) continue;
      cos.push((s.min.cos[c] + s.max.cos[c]) / 2);
      sin.push((s.min.sin[c] + s.max.sin[c]) / 2);
    }
  }
  const order = cos.map((_, i) => i).sort((a, b) => cos[a] - cos[b]);
  return [order.map((i) => cos[i]), order.map((i) => sin[i])];
}

function histogramData(s: LiveSamples): Data {
  const h = s.summary?.histogram;
  if (!h) return [[], [], []];
  // edgesLsb holds each bin's left edge.
  const centres = h.cos.map((_, i) => h.edgesLsb[i] + 0.5 / h.binsPerLsb);
  return [centres, h.cos, h.sin];
}

interface ChartSpec {
  title: string;
  testId: string;
  options: Omit<uPlot.Options, 'width' | 'height'>;
  data: (s: LiveSamples) => Data;
  onSummary?: boolean;
}

const specs: ChartSpec[] = [
  {
    title: 'Returned against exact',
    testId: 'chart-values',
    options: { scales: { x: { time: false } }, axes: [axis('angle, °'), axis()], series: [{}, line(REFERENCE, 'exact cos'), dots(SIGNAL, 'cos'), line(INK, 'exact sin'), dots(FAIL, 'sin')] },
    data: (s) => angleData(s, ['cos', 'sin'], true),
  },
  {
    title: 'Error against angle, LSB',
    testId: 'chart-error',
    options: { scales: { x: { time: false } }, axes: [axis('angle, °'), axis('LSB')], series: [{}, dots(SIGNAL, 'cos error'), dots(REFERENCE, 'sin error')] },
    data: (s) => angleData(s, ['errCos', 'errSin'], false),
  },
  {
    title: 'Error histogram',
    testId: 'chart-histogram',
    options: {
      scales: { x: { time: false } },
      axes: [axis('error, LSB'), axis('count')],
      series: [{}, { label: 'cos', stroke: SIGNAL, fill: SIGNAL + '88', paths: uPlot.paths.bars!({ size: [0.45, Infinity], align: -1 }) }, { label: 'sin', stroke: REFERENCE, fill: REFERENCE + '88', paths: uPlot.paths.bars!({ size: [0.45, Infinity], align: 1 }) }],
    },
    data: histogramData,
    onSummary: true,
  },
  {
    title: 'XY circle (sin against cos)',
    testId: 'chart-xy',
    options: { scales: { x: { time: false, range: [-1.1, 1.1] }, y: { range: [-1.1, 1.1] } }, axes: [axis('cos'), axis('sin')], series: [{}, dots(SIGNAL, 'sin vs cos')], cursor: { show: false } },
    data: xyData,
  },
];

/** The chart grid; `samples` is read on every animation frame, never rendered through React. */
export function LiveCharts({ samplesRef }: { samplesRef: { current: LiveSamples | null } }) {
  const boxes = useRef<(HTMLDivElement | null)[]>([]);
  useEffect(() => {
    const plots = specs.map((spec, i) => {
      const box = boxes.current[i]!;
      return new uPlot({ ...spec.options, width: box.clientWidth, height: 220, legend: { show: true, live: false } }, [[]], box);
    });
    const ro = new ResizeObserver(() => plots.forEach((p, i) => p.setSize({ width: boxes.current[i]!.clientWidth, height: 220 })));
    boxes.current.forEach((b) => b && ro.observe(b));
    let seen: LiveSamples | null = null;
    let version = -1;
    let summaryVersion = -1;
    let raf = 0;
    const tick = () => {
      const s = samplesRef.current;
      if (s && (s !== seen || s.version !== version || s.summaryVersion !== summaryVersion)) {
        const fresh = s !== seen;
        specs.forEach((spec, i) => {
          if (!fresh && (spec.onSummary ? s.summaryVersion === summaryVersion : s.version === version)) return;
          plots[i].setData(spec.data(s), true);
        });
        seen = s;
        version = s.version;
        summaryVersion = s.summaryVersion;
      }
      raf = requestAnimationFrame(tick);
    };
    raf = requestAnimationFrame(tick);
    return () => {
      cancelAnimationFrame(raf);
      ro.disconnect();
      plots.forEach((p) => p.destroy());
    };
  }, [samplesRef]);

  return (
    <div className="grid gap-4 xl:grid-cols-2">
      {specs.map((spec, i) => (
        <section key={spec.testId} aria-label={spec.title} className={`${panel} min-w-0`}>
          <h3 className={panelTitle}>{spec.title}</h3>
          <div data-testid={spec.testId} ref={(el) => void (boxes.current[i] = el)} className="min-w-0" />
        </section>
      ))}
    </div>
  );
}
