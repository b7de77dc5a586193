// A soak while it runs: where it is, the whole soak's figures, the timeline (uPlot, fed from the
// controller's books on each animation frame) and the unstable codes found so far.
import { useMemo } from 'react';
import { SignalCharts, type ChartFeed } from '../../../components/charts/signal-charts';
import { panel, panelTitle } from '../../../components/ui';
import { UnstableCodesTable } from '../../../components/unstable-codes-table';
import { describeSoak } from '../../../../shared/soak';
import type { BenchController, BenchSnapshot } from '../live/bench-controller';

const n = (v: number) => v.toLocaleString('en-US');
const minutes = (ms: number) => (ms < 60_000 ? `${(ms / 1000).toFixed(1)} s` : `${Math.floor(ms / 60_000)} min ${Math.round((ms % 60_000) / 1000)} s`);

/** Reads the controller's current soak on every frame; draws only when a pass was booked. */
function soakFeed(controller: BenchController): ChartFeed {
  let seen: unknown = null;
  let version = -1;
  return {
    poll(all) {
      const s = controller.soak;
      if (!s || (!all && s === seen && s.version === version)) return null;
      seen = s;
      version = s.version;
      return { [s.spec.kind === 'passes' ? 'soakByPass' : 'soakByTime']: s.timelineData() };
    },
  };
}

export function SoakLivePanel({ controller, run }: { controller: BenchController; run: NonNullable<BenchSnapshot['run']> }) {
  const feed = useMemo(() => soakFeed(controller), [controller]);
  const soak = run.soak;
  if (!soak) return null;
  const s = soak.summary;
  const ended = run.state === 'finished';
  const done = s?.passes ?? 0;
  const where =
    soak.spec.kind === 'passes'
      ? ended
        ? `${n(done)} of ${n(soak.spec.passes)} passes done`
        : `Pass ${n(soak.pass)} of ${n(soak.spec.passes)}`
      : ended
        ? `${n(done)} passes in ${minutes(s?.elapsedMs ?? 0)}`
        : `Pass ${n(soak.pass)}, ${minutes(s?.elapsedMs ?? 0)} of ${describeSoak(soak.spec)} done`;
  const figures: [string, string, boolean?][] = s
    ? [
        ['Passes done', n(s.passes)],
        ['Answers', `${n(s.answered)} of ${n(s.codesPerPass * s.passes)}`],
        ['Model mismatches', `${n(s.mismatches)}${s.mismatches ? ` in ${n(s.passesWithMismatches)} passes` : ''}`, s.mismatches > 0],
        ['Link errors', `${n(s.linkErrors)} (${n(s.checkFailures)} bad CHECK, ${n(s.missing)} never answered)`, s.linkErrors > 0],
        ['Re-asked', n(s.retries)],
      ]
    : [];
  return (
    <section aria-labelledby="soak-live-title" className={panel}>
      <h2 id="soak-live-title" className={panelTitle}>
        Soak — {describeSoak(soak.spec)}
      </h2>
      <div className="grid gap-3">
        <p className="flex flex-wrap items-baseline gap-x-4 text-sm">
          <span className="font-bold" data-testid="soak-where">
            {where}
          </span>
          <span className={`rounded px-2 py-0.5 font-bold ${soak.unstable.count ? 'bg-fail-soft text-fail' : 'bg-pass-soft text-pass'}`}>
            Unstable codes: <span data-testid="soak-unstable-count">{n(soak.unstable.count)}</span>
          </span>
          {!s && <span className="text-ink-soft">The figures appear when the first pass ends.</span>}
        </p>
        {s && (
          <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm" aria-label="Whole soak" data-testid="soak-figures">
            {figures.map(([k, v, bad]) => (
              <div key={k} className="contents">
                <dt className="text-ink-soft">{k}</dt>
                <dd className={`font-mono ${bad ? 'text-fail' : ''}`}>{v}</dd>
              </div>
            ))}
          </dl>
        )}
        <SignalCharts charts={[soak.spec.kind === 'passes' ? 'soakByPass' : 'soakByTime']} feed={feed} heightPx={180} className="grid" />
        {soak.unstable.first.length > 0 && (
          <div className="overflow-x-auto">
            <UnstableCodesTable codes={soak.unstable.first} label="Unstable codes so far" className="w-full" />
            {soak.unstable.count > soak.unstable.first.length && (
              <p className="text-xs text-ink-soft">
                The first {soak.unstable.first.length} of {n(soak.unstable.count)}; the saved session keeps them with every answer.
              </p>
            )}
          </div>
        )}
      </div>
    </section>
  );
}
