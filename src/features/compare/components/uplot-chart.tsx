// A small uPlot wrapper: the chart is made once per `options` (keep them stable with useMemo),
// fed with setData when `data` changes, sized to its box by a ResizeObserver, destroyed on unmount.
import { useEffect, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';

export function UplotChart({ options, data, height = 240, testId }: { options: Omit<uPlot.Options, 'width' | 'height'>; data: uPlot.AlignedData; height?: number; testId?: string }) {
  const box = useRef<HTMLDivElement>(null);
  const plot = useRef<uPlot | null>(null);
  const latest = useRef(data);
  latest.current = data;

  useEffect(() => {
    const el = box.current!;
    const p = new uPlot({ ...options, width: Math.max(200, el.clientWidth), height }, latest.current, el);
    plot.current = p;
    const ro = new ResizeObserver(() => p.setSize({ width: Math.max(200, el.clientWidth), height }));
    ro.observe(el);
    return () => {
      ro.disconnect();
      p.destroy();
      plot.current = null;
    };
  }, [options, height]);

  useEffect(() => {
    plot.current?.setData(data);
  }, [data]);

  return <div ref={box} data-testid={testId} className="min-w-0" />;
}
