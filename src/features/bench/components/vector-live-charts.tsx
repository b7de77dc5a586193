// A vectoring run's live charts: angle error by direction, magnitude error by magnitude, the two
// histograms, and the x–y error map, fed from the controller's VectorLiveSamples whenever it has
// moved, so answers never pass through React state.
import { useMemo } from 'react';
import type uPlot from 'uplot';
import { ErrorMap, type ErrorMapFeed } from '../../../components/charts/error-map';
import { SignalCharts, type ChartFeed } from '../../../components/charts/signal-charts';
import { vectorHistogramData, type VectorCharts } from '../../../components/charts/vector-plot-data';
import type { VectorLiveSamples } from '../live/vector-live-samples';

const CHARTS = ['angleError', 'magnitudeError', 'vectorHistogram'] as const;

/** Both feeds read one chart build per version of the samples. */
function liveFeeds(ref: { current: VectorLiveSamples | null }): { charts: ChartFeed; map: ErrorMapFeed } {
  let built: { s: VectorLiveSamples; version: number; charts: VectorCharts } | null = null;
  const current = () => {
    const s = ref.current;
    if (!s) return null;
    if (!built || built.s !== s || built.version !== s.plot.version) built = { s, version: s.plot.version, charts: s.plot.charts() };
    return built.charts;
  };
  const seen = (() => {
    const make = () => ({ s: null as VectorLiveSamples | null, version: -1, summaryVersion: -1 });
    return { charts: make(), map: make() };
  })();
  return {
    charts: {
      poll(all) {
        const s = ref.current;
        if (!s) return null;
        const mark = seen.charts;
        const fresh = all || s !== mark.s;
        const moved = fresh || s.plot.version !== mark.version;
        const summed = fresh || s.summaryVersion !== mark.summaryVersion;
        Object.assign(mark, { s, version: s.plot.version, summaryVersion: s.summaryVersion });
        if (!moved && !summed) return null;
        const c = moved ? current() : null;
        const out: Partial<Record<'angleError' | 'magnitudeError' | 'vectorHistogram', uPlot.AlignedData>> = {};
        if (c) Object.assign(out, { angleError: c.angleError, magnitudeError: c.magnitudeError });
        if (summed) out.vectorHistogram = vectorHistogramData(s.summary?.histogram);
        return out;
      },
    },
    map: {
      poll(all) {
        const s = ref.current;
        if (!s) return null;
        const mark = seen.map;
        if (!all && s === mark.s && s.plot.version === mark.version) return null;
        Object.assign(mark, { s, version: s.plot.version });
        return current()?.map ?? null;
      },
    },
  };
}

export function VectorLiveCharts({ samplesRef }: { samplesRef: { current: VectorLiveSamples | null } }) {
  const feeds = useMemo(() => liveFeeds(samplesRef), [samplesRef]);
  return (
    // One grid for all four: the map takes the place beside the histogram.
    <div className="grid gap-4 xl:grid-cols-2">
      <SignalCharts charts={CHARTS} feed={feeds.charts} className="contents" />
      <ErrorMap feed={feeds.map} />
    </div>
  );
}
