import { useMemo } from 'react';
import uPlot from 'uplot';
import { panel, panelTitle } from '../../../components/ui';
import type { ComparedSession } from '../api/compare-types';
import { alignSeries, envelopeSeries, histogramSeries, sessionName } from './chart-data';
import { ANGLE_SYNC, axis, colourOf } from './chart-look';
import { UplotChart } from './uplot-chart';

/** Error against angle and the error histograms, one series per session, in the sessions' colours. */
export function OverlayCharts({ sessions }: { sessions: ComparedSession[] }) {
  const names = sessions.map(sessionName).join('|');
  const envelopeOptions = useMemo(
    () => ({
      scales: { x: { time: false } },
      axes: [axis('angle, °'), axis('error, LSB')],
      cursor: { sync: { key: ANGLE_SYNC } },
      series: [{ label: 'angle, °' }, ...names.split('|').map((label, i): uPlot.Series => ({ label, stroke: colourOf(i), width: 1, spanGaps: true }))],
    }),
    [names],
  );
  const histogramOptions = useMemo(
    () => ({
      scales: { x: { time: false } },
      axes: [axis('error, LSB'), axis('share of answers, %')],
      series: [
        { label: 'error, LSB' },
        ...names.split('|').map((label, i): uPlot.Series => ({ label, stroke: colourOf(i), width: 2, paths: uPlot.paths.stepped!({ align: 1 }) })),
      ],
    }),
    [names],
  );
  const envelope = useMemo(() => alignSeries(sessions.map(envelopeSeries)), [sessions]);
  const histogram = useMemo(() => alignSeries(sessions.map(histogramSeries)), [sessions]);

  return (
    <div className="grid gap-4 xl:grid-cols-2">
      <section aria-label="Error against angle" className={`${panel} min-w-0`}>
        <h2 className={panelTitle}>Error against angle</h2>
        <p className="mb-2 text-xs text-ink-soft">Each line sweeps the lowest to the highest error (cos and sin) of every half-degree band.</p>
        <UplotChart options={envelopeOptions} data={envelope} testId="compare-error-chart" />
      </section>
      <section aria-label="Error histograms" className={`${panel} min-w-0`}>
        <h2 className={panelTitle}>Error histograms</h2>
        <p className="mb-2 text-xs text-ink-soft">Share of each session’s answers (cos and sin) per error bin, so runs of any length compare.</p>
        <UplotChart options={histogramOptions} data={histogram} testId="compare-histogram-chart" />
      </section>
    </div>
  );
}
