// What both kinds of session charts (SessionCharts, VectorSessionCharts) show around their plots:
// until they are drawn, no samples, why they could not be drawn, or the scoring's progress; once
// drawn, whether the browser's scoring of the stored samples agrees with the server's.
import { useSyncExternalStore } from 'react';
import { panel } from '../../../components/ui';
import type { SessionRecord } from '../../../lib/resources/sessions';
import { scoringProgress } from '../scoring/scoring-progress';

const int = (v: number) => v.toLocaleString('en-US');

/** The plots' place until they are drawn; `error` when they could not be. */
export function PlotsPending({ session, error }: { session: SessionRecord; error: Error | null }) {
  const progress = useSyncExternalStore(scoringProgress.subscribe, () => scoringProgress.get(session.id));
  if (session.sampleCount === 0) return <p className={`${panel} text-sm text-ink-soft`}>This session holds no samples to plot.</p>;
  if (error) {
    return (
      <p role="alert" className={`${panel} text-sm font-bold text-fail`}>
        The plots could not be drawn: {error.message}
      </p>
    );
  }
  const share = progress ? Math.round((progress.done / progress.total) * 100) : 0;
  return (
    <div className={panel} aria-live="polite">
      <p className="mb-2 text-sm text-ink-soft">{progress ? `Scoring ${int(progress.done)} of ${int(progress.total)} samples…` : `Loading ${int(session.sampleCount)} samples…`}</p>
      <div className="h-2 rounded bg-paper" role="progressbar" aria-label="Scoring the stored samples" aria-valuemin={0} aria-valuemax={100} aria-valuenow={share}>
        <div className="h-2 rounded bg-signal" style={{ width: `${share}%` }} />
      </div>
    </div>
  );
}

/** Whether the browser's figures are the server's; where not, `differs` says which and `changed` what may have changed. */
export function BrowserRecheck({ agrees, count, differs, changed }: { agrees: boolean; count: number; differs: string; changed: string }) {
  return (
    <p data-testid="browser-recheck" className={`text-sm ${agrees ? 'text-ink-soft' : 'font-bold text-fail'}`}>
      {agrees ? `Scored again in this browser from the ${int(count)} stored samples: the same figures as the server's.` : `Scored again in this browser, the figures differ from the server's (${differs}). The core's ${changed} may have changed since.`}
    </p>
  );
}
