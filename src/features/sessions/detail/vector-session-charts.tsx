import { useMemo, useSyncExternalStore } from 'react';
import { ErrorMap } from '../../../components/charts/error-map';
import { SignalCharts, staticFeed } from '../../../components/charts/signal-charts';
import { vectorHistogramData } from '../../../components/charts/vector-plot-data';
import { panel } from '../../../components/ui';
import type { VectorConfig } from '../../../../shared/vectoring';
import { useVectorSessionPlots } from '../api/get-session-plots';
import type { SessionRecord } from '../../../lib/resources/sessions';
import { scoringProgress } from '../scoring/scoring-progress';

const CHARTS = ['angleError', 'magnitudeError', 'vectorHistogram'] as const;

/** The Bench page's vectoring plots, rebuilt from the stored samples. */
export function VectorSessionCharts({ session, config }: { session: SessionRecord; config: VectorConfig | undefined }) {
  const plots = useVectorSessionPlots(session.id, config);
  const progress = useSyncExternalStore(scoringProgress.subscribe, () => scoringProgress.get(session.id));
  const feeds = useMemo(() => {
    if (!plots.data) return null;
    const { charts, summary } = plots.data;
    return { charts: staticFeed({ angleError: charts.angleError, magnitudeError: charts.magnitudeError, vectorHistogram: vectorHistogramData(summary.histogram) }), map: { poll: (all: boolean) => (all ? charts.map : null) } };
  }, [plots.data]);

  if (session.sampleCount === 0) return <p className={`${panel} text-sm text-ink-soft`}>This session holds no samples to plot.</p>;
  if (plots.isError) {
    return (
      <p role="alert" className={`${panel} text-sm font-bold text-fail`}>
        The plots could not be drawn: {plots.error.message}
      </p>
    );
  }
  if (!feeds || !plots.data) {
    const share = progress ? Math.round((progress.done / progress.total) * 100) : 0;
    return (
      <div className={panel} aria-live="polite">
        <p className="mb-2 text-sm text-ink-soft">
          {progress ? `Scoring ${progress.done.toLocaleString('en-US')} of ${progress.total.toLocaleString('en-US')} samples…` : `Loading ${session.sampleCount.toLocaleString('en-US')} samples…`}
        </p>
        <div className="h-2 rounded bg-paper" role="progressbar" aria-label="Scoring the stored samples" aria-valuemin={0} aria-valuemax={100} aria-valuenow={share}>
          <div className="h-2 rounded bg-signal" style={{ width: `${share}%` }} />
        </div>
      </div>
    );
  }
  const server = session.stats.vectoring;
  const mine = plots.data.summary;
  const agrees = !!server && server.angleLsb.maxAbs === mine.angleLsb.maxAbs && server.magnitudeLsb.maxAbs === mine.magnitudeLsb.maxAbs && server.mismatches.count === mine.mismatches.count && server.count === mine.count;
  return (
    <div className="grid gap-2">
      <p data-testid="browser-recheck" className={`text-sm ${agrees ? 'text-ink-soft' : 'font-bold text-fail'}`}>
        {agrees
          ? `Scored again in this browser from the ${mine.count.toLocaleString('en-US')} stored samples: the same figures as the server's.`
          : `Scored again in this browser, the figures differ from the server's (largest angle error ${mine.angleLsb.maxAbs.toFixed(3)} LSB, largest magnitude error ${mine.magnitudeLsb.maxAbs.toFixed(3)} LSB, ${mine.mismatches.count} mismatches). The core's configuration may have changed since.`}
      </p>
      <div className="grid gap-4 xl:grid-cols-2">
        <SignalCharts charts={CHARTS} feed={feeds.charts} heightPx={260} className="contents" />
        <ErrorMap feed={feeds.map} />
      </div>
    </div>
  );
}
