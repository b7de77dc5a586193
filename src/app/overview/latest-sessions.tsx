import { Link } from 'react-router-dom';
import { panel, panelTitle } from '../../components/ui';
import { useSessions } from '../../features/sessions/api/get-sessions';
import { RegressionBadge, VerdictBadge } from '../../features/sessions/components/verdict-badges';
import { DEFAULT_FILTERS } from '../../features/sessions/list/session-filters';

const LATEST = { ...DEFAULT_FILTERS, pageSize: 8 };

/** The newest bench sessions of the whole lab, each with its verdict in words. */
export function LatestSessions() {
  const sessions = useSessions(LATEST);
  return (
    <section aria-labelledby="latest-title" className={panel}>
      <h2 id="latest-title" className={panelTitle}>
        Latest sessions
      </h2>
      {sessions.isPending && <p className="text-sm text-ink-soft">Loading…</p>}
      {sessions.isError && <p role="alert" className="text-sm text-fail">Could not load sessions: {sessions.error.message}</p>}
      {sessions.data && sessions.data.items.length === 0 && <p className="text-sm text-ink-soft">No session saved yet. Run one from the Bench page.</p>}
      {sessions.data && sessions.data.items.length > 0 && (
        <table className="w-full text-sm">
          <thead className="text-left text-ink-soft">
            <tr>
              <th className="py-1 pr-3 font-normal">session</th>
              <th className="py-1 pr-3 font-normal">core / build</th>
              <th className="py-1 pr-3 font-normal">board</th>
              <th className="py-1 pr-3 text-right font-normal">samples</th>
              <th className="py-1 font-normal">verdict</th>
            </tr>
          </thead>
          <tbody>
            {sessions.data.items.map((s) => (
              <tr key={s.id} className="border-t border-rule">
                <td className="py-1.5 pr-3">
                  <Link to={`/sessions/${s.id}`} className="font-bold underline">
                    {s.id}
                  </Link>{' '}
                  <span className="text-ink-soft">{new Date(s.startedAt).toLocaleDateString()}</span>
                </td>
                <td className="py-1.5 pr-3">
                  {s.core?.slug ?? s.coreId}
                  {s.build ? ` / ${s.build.label}` : ''}
                </td>
                <td className="py-1.5 pr-3">{s.board?.name ?? '—'}</td>
                <td className="py-1.5 pr-3 text-right font-mono">{s.sampleCount.toLocaleString()}</td>
                <td className="flex gap-1.5 py-1.5">
                  <VerdictBadge passed={s.passed} />
                  {s.regression && <RegressionBadge />}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      <Link to="/sessions" className="mt-3 inline-block text-sm underline">
        All sessions
      </Link>
    </section>
  );
}
