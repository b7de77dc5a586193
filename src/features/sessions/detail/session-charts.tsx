import { useMemo, useSyncExternalStore } from 'react';
import { histogramData } from '../../../components/charts/chart-specs';
import { SignalCharts, staticFeed } from '../../../components/charts/signal-charts';
import { panel } from '../../../components/ui';
import type { ModelConfig } from '../../../../shared/numeric';
import { useSessionPlots } from '../api/get-session-plots';
import type { SessionRecord } from '../../../lib/resources/sessions';
import { scoringProgress } from '../scoring/scoring-progress';

const CHARTS = ['values', 'xy', 'errorCos', 'errorSin', 'histogram'] as const;

/** The Bench page's plots, rebuilt from the stored samples. */
export function SessionCharts({ session, config }: { session: SessionRecord; config: ModelConfig | undefined }) {
  const plots = useSessionPlots(session.id, config);
  const progress = useSyncExternalStore(scoringProgress.subscribe, () => scoringProgress.get(session.id));
  const feed = useMemo(() => (plots.data ? staticFeed({ ...plots.data.charts, histogram: histogramData(plots.data.summary.histogram) }) : null), [plots.data]);

  if (session.sampleCount === 0) return <p className={`${panel} text-sm text-ink-soft`}>This session holds no samples to plot.</p>;
  if (plots.isError) {
    return (
      <p role="alert" className={`${panel} text-sm font-bold text-fail`}>
        The plots could not be drawn: {plots.error.message}
      </p>
    );
  }
  if (!feed || !plots.data) {
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
  const server = session.stats;
  const mine = plots.data.summary;
  const agrees = server.overall?.maxAbsLsb === mine.overall.maxAbsLsb && server.mismatches?.count === mine.mismatches.count && server.count === mine.count;
  return (
    <div className="grid gap-2">
      <p data-testid="browser-recheck" className={`text-sm ${agrees ? 'text-ink-soft' : 'font-bold text-fail'}`}>
        {agrees
          ? `Scored again in this browser from the ${mine.count.toLocaleString('en-US')} stored samples: the same figures as the server's.`
          : `Scored again in this browser, the figures differ from the server's (largest error ${mine.overall.maxAbsLsb.toFixed(3)} LSB, ${mine.mismatches.count} mismatches). The core's model may have changed since.`}
      </p>
      <SignalCharts charts={CHARTS} feed={feed} heightPx={260} />
    </div>
  );
}
