import { useMemo } from 'react';
import { histogramData } from '../../../components/charts/chart-specs';
import { SignalCharts, staticFeed } from '../../../components/charts/signal-charts';
import type { ModelConfig } from '../../../../shared/numeric';
import { useSessionPlots } from '../api/get-session-plots';
import type { SessionRecord } from '../../../lib/resources/sessions';
import { BrowserRecheck, PlotsPending } from './plots-pending';

const CHARTS = ['values', 'xy', 'errorCos', 'errorSin', 'histogram'] as const;

/** The Bench page's plots, rebuilt from the stored samples. */
export function SessionCharts({ session, config }: { session: SessionRecord; config: ModelConfig | undefined }) {
  const plots = useSessionPlots(session.id, config);
  const feed = useMemo(() => (plots.data ? staticFeed({ ...plots.data.charts, histogram: histogramData(plots.data.summary.histogram) }) : null), [plots.data]);

  if (session.sampleCount === 0 || plots.isError || !feed || !plots.data) return <PlotsPending session={session} error={plots.isError ? plots.error : null} />;
  const server = session.stats;
  const mine = plots.data.summary;
  const agrees = server.overall?.maxAbsLsb === mine.overall.maxAbsLsb && server.mismatches?.count === mine.mismatches.count && server.count === mine.count;
  return (
    <div className="grid gap-2">
      <BrowserRecheck agrees={agrees} count={mine.count} differs={`largest error ${mine.overall.maxAbsLsb.toFixed(3)} LSB, ${mine.mismatches.count} mismatches`} changed="model" />
      <SignalCharts charts={CHARTS} feed={feed} heightPx={260} />
    </div>
  );
}
