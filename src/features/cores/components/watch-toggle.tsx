import { btn, fieldError } from '../../../components/ui';
import type { Watcher } from '../../../lib/resources/core-detail';
import { useSetWatching } from '../api/watch-core';

/** Who is mailed when a session of this core regresses, and a toggle for the signed-in user. */
export function WatchPanel({ coreId, watchers, watching }: { coreId: number; watchers: Watcher[]; watching: boolean }) {
  const toggle = useSetWatching(coreId);
  return (
    <div className="grid gap-2">
      <p className="text-sm" data-testid="watchers">
        {watchers.length === 0 ? 'Nobody watches this core yet.' : `Watching: ${watchers.map((w) => w.name).join(', ')}.`}
      </p>
      <p className="text-xs text-ink-soft">Watchers get an e-mail when a new session fails a limit the baseline met.</p>
      <div>
        <button type="button" className={btn} aria-pressed={watching} disabled={toggle.isPending} onClick={() => toggle.mutate(!watching)}>
          {watching ? 'Stop watching' : 'Watch this core'}
        </button>
      </div>
      {toggle.isError && <p role="alert" className={fieldError}>That did not work: {toggle.error.message}</p>}
    </div>
  );
}
