import { Link } from 'react-router-dom';
import { panel, panelTitle } from '../../components/ui';
import { useBuildList, type BuildRecord } from '../../lib/resources/builds';
import { StatusBadge } from '../../features/builds/components/status-badge';
import { useSessions } from '../../features/sessions/api/get-sessions';
import { DEFAULT_FILTERS } from '../../features/sessions/list/session-filters';

const REGRESSIONS = { ...DEFAULT_FILTERS, regression: true, pageSize: 5 };

/** What a lead looks at first: regressions, failing builds and builds waiting for a sign-off. */
export function AttentionPanel() {
  const regressions = useSessions(REGRESSIONS);
  const builds = useBuildList(null);
  const failing = builds.data?.filter((b) => b.status === 'failing') ?? [];
  const awaiting = builds.data?.filter((b) => b.status === 'passing') ?? [];

  return (
    <section aria-labelledby="attention-title" className={panel}>
      <h2 id="attention-title" className={panelTitle}>
        Needs attention
      </h2>
      <div className="grid gap-5 md:grid-cols-3">
        <div>
          <h3 className="mb-2 font-bold">Regressions</h3>
          {regressions.isPending && <p className="text-sm text-ink-soft">Loading…</p>}
          {regressions.isError && <p role="alert" className="text-sm text-fail">Could not load sessions: {regressions.error.message}</p>}
          {regressions.data && regressions.data.items.length === 0 && <p className="text-sm text-ink-soft">None: every session meets what its core’s baseline met.</p>}
          <ul className="grid gap-1.5 text-sm">
            {regressions.data?.items.map((s) => (
              <li key={s.id}>
                <Link to={`/sessions/${s.id}`} className="font-bold underline">
                  Session {s.id}
                </Link>{' '}
                <span className="text-ink-soft">
                  {s.core?.name ?? `core ${s.coreId}`}
                  {s.build ? `, build ${s.build.label}` : ''}, {new Date(s.startedAt).toLocaleDateString()}
                </span>
              </li>
            ))}
          </ul>
          {regressions.data && regressions.data.total > regressions.data.items.length && (
            <Link to="/sessions?regression=true" className="mt-2 inline-block text-sm underline">
              All {regressions.data.total} regressions
            </Link>
          )}
        </div>
        <BuildColumn title="Failing builds" empty="No build’s latest session fails." builds={failing} query={builds} />
        <BuildColumn title="Waiting for review" empty="No passing build is waiting for a decision." builds={awaiting} query={builds} />
      </div>
    </section>
  );
}

function BuildColumn({ title, empty, builds, query }: { title: string; empty: string; builds: BuildRecord[]; query: ReturnType<typeof useBuildList> }) {
  return (
    <div>
      <h3 className="mb-2 font-bold">{title}</h3>
      {query.isPending && <p className="text-sm text-ink-soft">Loading…</p>}
      {query.isError && <p role="alert" className="text-sm text-fail">Could not load builds: {query.error.message}</p>}
      {query.data && builds.length === 0 && <p className="text-sm text-ink-soft">{empty}</p>}
      <ul className="grid gap-1.5 text-sm">
        {builds.slice(0, 5).map((b) => (
          <li key={b.id} className="flex flex-wrap items-center gap-2">
            <Link to={`/builds/${b.id}`} className="font-bold underline">
              {b.label}
            </Link>
            <StatusBadge status={b.status} />
            <span className="text-ink-soft">
              {b.sessionCount} session{b.sessionCount === 1 ? '' : 's'}
            </span>
          </li>
        ))}
      </ul>
    </div>
  );
}
