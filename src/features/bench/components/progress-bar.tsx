import type { BenchSnapshot } from '../live/bench-controller';

const fmtS = (s: number) => (s < 1 ? `${Math.round(s * 1000)} ms` : s < 60 ? `${s.toFixed(s < 10 ? 1 : 0)} s` : `${Math.floor(s / 60)} min ${Math.round(s % 60)} s`);

/** How far the run is: done of total, results per second and time left. */
export function ProgressBar({ run }: { run: NonNullable<BenchSnapshot['run']> }) {
  const p = run.progress;
  const done = p?.done ?? 0;
  const total = p?.total ?? 0;
  const share = total ? done / total : 0;
  const r = run.result;
  // A finished run's rate is over the whole run (the rolling rate needs half a second to form).
  // A soak's bar is its pass under way (or last pass); its time and rate are the whole soak's.
  const soak = run.soak?.summary;
  const rate = r ? (soak && soak.elapsedMs > 0 ? (soak.answered * 1000) / soak.elapsedMs : r.elapsedMs > 0 ? (done * 1000) / r.elapsedMs : null) : p && p.ratePerS > 0 ? p.ratePerS : null;
  const state = r ? (r.status === 'complete' ? 'Complete' : r.status === 'aborted' ? 'Aborted' : 'Failed') : run.state === 'paused' ? 'Paused' : 'Running';
  return (
    <div className="grid gap-1.5">
      <div className="flex flex-wrap items-baseline gap-x-4 gap-y-1 text-sm">
        <span className="font-bold" data-testid="run-state">
          {state}
        </span>
        <span className="font-mono text-base" data-testid="run-progress">
          {done.toLocaleString('en-US')} / {total.toLocaleString('en-US')}
        </span>
        <span className="font-mono text-ink-soft">{rate === null ? '— results/s' : `${Math.round(rate).toLocaleString('en-US')} results/s`}</span>
        <span className="font-mono text-ink-soft">{r ? `took ${fmtS(r.elapsedMs / 1000)}` : p?.etaS != null ? `${fmtS(p.etaS)} left` : ''}</span>
        {(p?.missing ?? 0) > 0 && <span className="font-mono text-fail">{p!.missing.toLocaleString('en-US')} missing</span>}
      </div>
      <div role="progressbar" aria-label="Run progress" aria-valuemin={0} aria-valuemax={total} aria-valuenow={done} className="h-3 overflow-hidden rounded bg-rule/60">
        <div className={`h-full ${r && r.status !== 'complete' ? 'bg-fail' : 'bg-signal'}`} style={{ width: `${(share * 100).toFixed(2)}%` }} />
      </div>
      {(r?.message || run.error) && (
        <p role="alert" className="text-sm text-fail">
          {run.error ?? r?.message}
        </p>
      )}
    </div>
  );
}
