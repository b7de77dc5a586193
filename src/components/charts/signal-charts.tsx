// A grid of signal charts. Each uPlot is made once; one animation-frame loop asks the feed for
// whatever changed and hands it straight to uPlot, so samples never pass through React state.
import { useEffect, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import { panel, panelTitle } from '../ui';
import { CHART_SPECS, xyExtent, type ChartId } from './chart-specs';
import { squarePlotHooks } from './square-plot';

/**
 * Where the charts get their data: polled once per animation frame, with the frame's time stamp;
 * return only what changed, or everything when `all` is set (the first poll after the charts were
 * made).
 */
export interface ChartFeed {
  poll(all: boolean, frameTimeMs: number): Partial<Record<ChartId, uPlot.AlignedData>> | null;
}

export interface SignalChartsProps {
  charts: readonly ChartId[];
  feed: ChartFeed;
  /** Canvas height in CSS px (the XY chart is as wide as its plotting area is high). */
  heightPx?: number;
  className?: string;
  /** Off where the page already titles the chart in a section of its own (the printed report). */
  showTitles?: boolean;
}

export function SignalCharts({ charts, feed, heightPx = 220, className = 'grid gap-4 xl:grid-cols-2', showTitles = true }: SignalChartsProps) {
  const boxes = useRef<(HTMLDivElement | null)[]>([]);
  const key = charts.join(',');

  useEffect(() => {
    const ids = key.split(',') as ChartId[];
    const extents = ids.map(() => 1.1);
    // The elements of this effect's lifetime: React clears the refs on unmount before the cleanup
    // below disconnects the observer, and a resize can land in between.
    const els = ids.map((_, i) => boxes.current[i]!);
    const plots = ids.map((id, i) => {
      const box = els[i];
      const spec = CHART_SPECS[id];
      if (id !== 'xy') return new uPlot({ ...spec.options, width: box.clientWidth, height: heightPx, legend: { show: true, live: false } }, [[]], box);
      const range = (): uPlot.Range.MinMax => [-extents[i], extents[i]];
      return new uPlot(
        { ...spec.options, scales: { x: { time: false, range }, y: { range } }, hooks: squarePlotHooks(), width: heightPx, height: heightPx, legend: { show: true, live: false } },
        [[]],
        box,
      );
    });
    const ro = new ResizeObserver(() => ids.forEach((id, i) => id !== 'xy' && plots[i].setSize({ width: els[i].clientWidth, height: heightPx })));
    els.forEach((b) => ro.observe(b));
    let raf = 0;
    let first = true;
    const tick = (frameTimeMs: number) => {
      const fresh = feed.poll(first, frameTimeMs);
      first = false;
      if (fresh) {
        ids.forEach((id, i) => {
          const data = fresh[id];
          if (!data) return;
          if (id === 'xy') extents[i] = xyExtent(data);
          // One commit per chart rather than one per changed option.
          plots[i].batch(() => plots[i].setData(data, true));
        });
      }
      raf = requestAnimationFrame(tick);
    };
    raf = requestAnimationFrame(tick);
    return () => {
      cancelAnimationFrame(raf);
      ro.disconnect();
      plots.forEach((p) => p.destroy());
    };
  }, [feed, key, heightPx]);

  return (
    <div className={className}>
      {charts.map((id, i) => {
        const plot = <div data-testid={CHART_SPECS[id].testId} ref={(el) => void (boxes.current[i] = el)} className={id === 'xy' ? 'flex min-w-0 justify-center' : 'min-w-0'} />;
        // Untitled, the chart sits in a section of the caller's that names it: a second landmark
        // of the same name would only repeat it.
        return showTitles ? (
          <section key={id} aria-label={CHART_SPECS[id].title} className={`${panel} min-w-0 break-inside-avoid`}>
            <h3 className={panelTitle}>{CHART_SPECS[id].title}</h3>
            {plot}
          </section>
        ) : (
          <div key={id} className={`${panel} min-w-0 break-inside-avoid`}>
            {plot}
          </div>
        );
      })}
    </div>
  );
}

/** A feed that hands over one fixed set of data on the first frame, for stored sessions. */
export function staticFeed(data: Partial<Record<ChartId, uPlot.AlignedData>>): ChartFeed {
  return { poll: (all) => (all ? data : null) };
}
