// The four live charts (shared with the Session page, in components/charts), fed from the
// LiveSamples store whenever it has moved, so results never pass through React state.
import { useMemo } from 'react';
import type uPlot from 'uplot';
import { histogramData } from '../../../components/charts/chart-specs';
import { SignalCharts, type ChartFeed } from '../../../components/charts/signal-charts';
import { slotGate } from '../live/frame-slot';
import { COLUMNS, RAW_LIMIT, type LiveSamples } from '../live/live-samples';

type Data = uPlot.AlignedData;
const CHARTS = ['values', 'error', 'histogram', 'xy'] as const;

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

/**
 * A feed that reads the controller's current sample store, in the first frame of each frame slot
 * (the frames the rest of the page changes in too): the charts redraw a few times a second at most.
 */
function liveFeed(samplesRef: { current: LiveSamples | null }): ChartFeed {
  let seen: LiveSamples | null = null;
  let version = -1;
  let summaryVersion = -1;
  const slotStart = slotGate();
  return {
    poll(all, frameTimeMs) {
      const s = samplesRef.current;
      // Called every frame, so the gate sees every slot's first frame.
      const due = slotStart(frameTimeMs);
      if (!s || (!due && !all && s === seen)) return null;
      const fresh = all || s !== seen;
      const moved = fresh || s.version !== version;
      const summed = fresh || s.summaryVersion !== summaryVersion;
      seen = s;
      version = s.version;
      summaryVersion = s.summaryVersion;
      if (!moved && !summed) return null;
      return {
        ...(moved ? { values: angleData(s, ['cos', 'sin'], true), error: angleData(s, ['errCos', 'errSin'], false), xy: xyData(s) } : {}),
        ...(summed ? { histogram: histogramData(s.summary?.histogram) } : {}),
      };
    },
  };
}

/** The chart grid; `samples` is read on every animation frame, never rendered through React. */
export function LiveCharts({ samplesRef }: { samplesRef: { current: LiveSamples | null } }) {
  const feed = useMemo(() => liveFeed(samplesRef), [samplesRef]);
  return <SignalCharts charts={CHARTS} feed={feed} />;
}
