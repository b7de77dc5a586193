import { useEffect, useRef, useState, useSyncExternalStore } from 'react';
import { BenchController } from '../live/bench-controller';
import type { LiveSamples } from '../live/live-samples';
import type { VectorLiveSamples } from '../live/vector-live-samples';
import { ConnectPanel } from './connect-panel';
import { LiveCharts } from './live-charts';
import { ProgressBar } from './progress-bar';
import { RestoreOffer } from './restore-offer';
import { RunPanel } from './run-panel';
import { SaveSessionPanel } from './save-session-panel';
import { SoakLivePanel } from './soak-live-panel';
import { StatsPanel } from './stats-panel';
import { TrafficPane } from './traffic-pane';
import { VectorLiveCharts } from './vector-live-charts';
import { VectorStatsPanel } from './vector-stats-panel';
import { panel } from '../../../components/ui';

/** The bench: link and plan on the left, progress, charts and traffic on the right. */
export function BenchPage() {
  const [controller] = useState(() => new BenchController());
  const snap = useSyncExternalStore(controller.subscribe, controller.getSnapshot);
  // The charts read the controller's current sample store through this ref on every frame.
  const samplesRef = useRef<LiveSamples | null>(null);
  const vectorSamplesRef = useRef<VectorLiveSamples | null>(null);
  useEffect(() => {
    samplesRef.current = controller.samples;
    vectorSamplesRef.current = controller.vectorSamples;
  });
  const vectoring = snap.run ? snap.run.mode === 'vectoring' : !!snap.modes?.vectoring && !snap.modes.rotation;
  useEffect(() => {
    const c = controller;
    void c.findUnsaved();
    return () => c.dispose();
  }, [controller]);

  return (
    // One stats panel: under the plan on narrower screens, a third column on wide ones.
    <div className="grid items-start gap-4 lg:grid-cols-[20rem_minmax(0,1fr)] lg:grid-rows-[auto_1fr] 2xl:grid-cols-[20rem_minmax(0,1fr)_24rem]">
      <div className="grid content-start gap-4 lg:col-start-1 lg:row-start-1">
        <h1 className="text-2xl font-bold">Bench</h1>
        <RestoreOffer controller={controller} snap={snap} />
        <ConnectPanel controller={controller} snap={snap} />
        <RunPanel controller={controller} snap={snap} />
        <SaveSessionPanel controller={controller} snap={snap} />
      </div>
      <div className="grid min-w-0 content-start gap-4 lg:col-start-2 lg:row-span-2 lg:row-start-1">
        <div className={panel}>{snap.run ? <ProgressBar run={snap.run} /> : <p className="text-sm text-ink-soft">{snap.status === 'connected' ? 'Connected. Choose a plan and run it.' : 'Connect to a board, then run a plan.'}</p>}</div>
        {snap.run?.soak && <SoakLivePanel controller={controller} run={snap.run} />}
        {vectoring ? <VectorLiveCharts samplesRef={vectorSamplesRef} /> : <LiveCharts samplesRef={samplesRef} />}
        <TrafficPane log={controller.traffic} />
      </div>
      <div className="lg:col-start-1 lg:row-start-2 2xl:col-start-3 2xl:row-span-2 2xl:row-start-1">
        {vectoring ? <VectorStatsPanel run={snap.run} /> : <StatsPanel run={snap.run} />}
      </div>
    </div>
  );
}
