// One difference chart (board − a model, LSB, against angle): made once, fed its data, sized to its box.
import { useEffect, useRef } from 'react';
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import { axis, dots, REFERENCE, SIGNAL } from '../../../components/charts/uplot-theme';

const OPTIONS: Omit<uPlot.Options, 'width' | 'height'> = {
  // At least ±1 LSB on y, so an all-zero difference reads as a flat line at 0, not as noise.
  scales: { x: { time: false }, y: { range: (_u, min, max) => [Math.min(-1, min), Math.max(1, max)] } },
  axes: [axis('angle, °'), axis('LSB')],
  series: [{}, dots(SIGNAL, 'cos'), dots(REFERENCE, 'sin')],
  legend: { show: true, live: false },
};

export function DiffChart({ data, height = 220, testId }: { data: uPlot.AlignedData; height?: number; testId: string }) {
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => {
    const el = box.current!;
    const p = new uPlot({ ...OPTIONS, width: Math.max(200, el.clientWidth), height }, data, el);
    const ro = new ResizeObserver(() => p.setSize({ width: Math.max(200, el.clientWidth), height }));
    ro.observe(el);
    return () => {
      ro.disconnect();
      p.destroy();
    };
  }, [data, height]);
  return <div ref={box} data-testid={testId} className="min-w-0" />;
}
