import { useMemo } from 'react';
import uPlot from 'uplot';
import { panel, panelTitle } from '../../../components/ui';
import type { ComparedSession } from '../api/compare-types';
import { alignSeries, envelopeSeries, histogramSeries, sessionName } from './chart-data';
import { ANGLE_SYNC, axis, colourOf } from './chart-look';
import { SessionLegend } from './session-legend';
import { UplotChart } from './uplot-chart';

/** Error against angle and the error histograms, one series per session, in the sessions' colours. */
export function OverlayCharts({ sessions }: { sessions: ComparedSession[] }) {
  const names = sessions.map(sessionName).join('|');
  // Vectoring sessions: the envelope is of the angle error against the input vector's direction.
  const vectoring = sessions[0]?.mode === 'vectoring';
  const xLabel = vectoring ? 'direction of (x, y), °' : 'angle, °';
  const envelopeOptions = useMemo(() => {
    const labels = names.split('|');
    return {
      scales: { x: { time: false } },
      axes: [axis(xLabel), axis(vectoring ? 'angle error, LSB' : 'error, LSB')],
      cursor: { sync: { key: ANGLE_SYNC } },
      legend: { show: false },
      series: [
        { label: xLabel },
        ...labels.flatMap((label, i): uPlot.Series[] => [
          // Sessions of other cores put their bins at slightly other angles: bridge those gaps.
          { label: `${label} highest`, stroke: colourOf(i), width: 1, spanGaps: true },
          { label: `${label} lowest`, stroke: colourOf(i), width: 1, spanGaps: true },
        ]),
      ],
      // Each session's band, translucent so the others show through it.
      bands: labels.map((_, i): uPlot.Band => ({ series: [2 * i + 1, 2 * i + 2], fill: `${colourOf(i)}33` })),
    };
  }, [names, xLabel, vectoring]);
  const histogramOptions = useMemo(
    () => ({
      scales: { x: { time: false } },
      axes: [axis('error, LSB'), axis('share of answers, %')],
      legend: { show: false },
      series: [
        { label: 'error, LSB' },
        ...names.split('|').map((label, i): uPlot.Series => ({ label, stroke: colourOf(i), width: 2, paths: uPlot.paths.stepped!({ align: 1 }) })),
      ],
    }),
    [names],
  );
  const envelope = useMemo(() => alignSeries(sessions.flatMap(envelopeSeries)), [sessions]);
  const histogram = useMemo(() => alignSeries(sessions.map(histogramSeries)), [sessions]);

  return (
    <div className="grid gap-4 xl:grid-cols-2">
      <section aria-label={vectoring ? 'Angle error against direction' : 'Error against angle'} className={`${panel} min-w-0`}>
        <h2 className={panelTitle}>{vectoring ? 'Angle error against direction' : 'Error against angle'}</h2>
        <p className="mb-2 text-xs text-ink-soft">
          {vectoring
            ? 'Each session’s band spans the lowest to the highest angle error in every half-degree of the input vector’s direction.'
            : 'Each session’s band spans the lowest to the highest error (cos and sin) in every half-degree of angle.'}
        </p>
        <UplotChart options={envelopeOptions} data={envelope} testId="compare-error-chart" />
        <SessionLegend names={sessions.map(sessionName)} />
      </section>
      <section aria-label="Error histograms" className={`${panel} min-w-0`}>
        <h2 className={panelTitle}>Error histograms</h2>
        <p className="mb-2 text-xs text-ink-soft">Share of each session’s answers ({vectoring ? 'angle and magnitude' : 'cos and sin'}) per error bin, so runs of any length compare.</p>
        <UplotChart options={histogramOptions} data={histogram} testId="compare-histogram-chart" />
        <SessionLegend names={sessions.map(sessionName)} />
      </section>
    </div>
  );
}
