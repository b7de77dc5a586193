import { useMemo } from 'react';
import { ErrorMap } from '../../../components/charts/error-map';
import { SignalCharts, staticFeed } from '../../../components/charts/signal-charts';
import { vectorHistogramData } from '../../../components/charts/vector-plot-data';
import type { VectorConfig } from '../../../../shared/vectoring';
import { useVectorSessionPlots } from '../api/get-session-plots';
import type { SessionRecord } from '../../../lib/resources/sessions';
import { BrowserRecheck, PlotsPending } from './plots-pending';

const CHARTS = ['angleError', 'magnitudeError', 'vectorHistogram'] as const;

/** The Bench page's vectoring plots, rebuilt from the stored samples. */
export function VectorSessionCharts({ session, config }: { session: SessionRecord; config: VectorConfig | undefined }) {
  const plots = useVectorSessionPlots(session.id, config);
  const feeds = useMemo(() => {
    if (!plots.data) return null;
    const { charts, summary } = plots.data;
    return { charts: staticFeed({ angleError: charts.angleError, magnitudeError: charts.magnitudeError, vectorHistogram: vectorHistogramData(summary.histogram) }), map: { poll: (all: boolean) => (all ? charts.map : null) } };
  }, [plots.data]);

  if (session.sampleCount === 0 || plots.isError || !feeds || !plots.data) return <PlotsPending session={session} error={plots.isError ? plots.error : null} />;
  const server = session.stats.vectoring;
  const mine = plots.data.summary;
  const agrees = !!server && server.angleLsb.maxAbs === mine.angleLsb.maxAbs && server.magnitudeLsb.maxAbs === mine.magnitudeLsb.maxAbs && server.mismatches.count === mine.mismatches.count && server.count === mine.count;
  return (
    <div className="grid gap-2">
      <BrowserRecheck
        agrees={agrees}
        count={mine.count}
        differs={`largest angle error ${mine.angleLsb.maxAbs.toFixed(3)} LSB, largest magnitude error ${mine.magnitudeLsb.maxAbs.toFixed(3)} LSB, ${mine.mismatches.count} mismatches`}
        changed="configuration"
      />
      <div className="grid gap-4 xl:grid-cols-2">
        <SignalCharts charts={CHARTS} feed={feeds.charts} heightPx={260} className="contents" />
        <ErrorMap feed={feeds.map} />
      </div>
    </div>
  );
}
