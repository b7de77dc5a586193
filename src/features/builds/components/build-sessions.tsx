import { Link } from 'react-router-dom';
import { panel, panelTitle } from '../../../components/ui';
import { useBuildSessions } from '../api/get-build-sessions';
import { formatWhen } from './build-format';

/** The compare page takes at most this many sessions. */
const COMPARE_AT_MOST = 6;

/** The sessions run on a build, latest first, each a link to its page. */
export function BuildSessions({ buildId }: { buildId: number }) {
  const sessions = useBuildSessions(buildId);
  return (
    <section aria-labelledby="build-sessions-title" className={panel}>
      <h2 id="build-sessions-title" className={panelTitle}>
        Sessions on this build {sessions.data && `(${sessions.data.total.toLocaleString('en-US')})`}
      </h2>
      {sessions.isPending && <p className="text-sm text-ink-soft">Loading sessions…</p>}
      {sessions.isError && (
        <p role="alert" className="text-sm text-fail">
          The sessions could not be loaded: {sessions.error.message}
        </p>
      )}
      {sessions.data && sessions.data.items.length >= 2 && (
        <p className="mb-2 text-sm">
          <Link to={`/compare?ids=${sessions.data.items.slice(0, COMPARE_AT_MOST).map((s) => s.id).join(',')}`} className="font-bold underline">
            Compare the latest {Math.min(COMPARE_AT_MOST, sessions.data.items.length)} sessions
          </Link>
        </p>
      )}
      {sessions.data?.items.length === 0 && <p className="text-sm text-ink-soft">No session has run on this build yet.</p>}
      {sessions.data && sessions.data.items.length > 0 && (
        <div className="overflow-x-auto">
          <table className="w-full text-sm" aria-label="Sessions on this build">
            <thead className="text-left text-xs uppercase tracking-wider text-ink-soft">
              <tr>
                <th scope="col" className="py-1 pr-3">Session</th>
                <th scope="col" className="py-1 pr-3">Ran</th>
                <th scope="col" className="py-1 pr-3">Verdict</th>
                <th scope="col" className="py-1 pr-3">Plan, samples</th>
                <th scope="col" className="py-1">Board, operator</th>
              </tr>
            </thead>
            <tbody>
              {sessions.data.items.map((s) => (
                <tr key={s.id} className="border-t border-rule/60 align-top">
                  <td className="py-1 pr-3">
                    <Link to={`/sessions/${s.id}`} className="font-bold underline">
                      #{s.id}
                    </Link>
                  </td>
                  <td className="py-1 pr-3 align-top whitespace-nowrap">{formatWhen(s.startedAt)}</td>
                  <td className={`py-1 pr-3 font-bold ${s.passed ? 'text-pass' : 'text-fail'}`}>
                    {s.passed ? 'PASS' : 'FAIL'}
                    {s.regression && <span className="ml-1 font-normal">(regression)</span>}
                  </td>
                  <td className="py-1 pr-3">
                    {s.plan?.kind ?? '—'}
                    <span className="block font-mono text-xs text-ink-soft">{s.sampleCount.toLocaleString('en-US')}</span>
                  </td>
                  <td className="py-1">
                    {s.board?.name ?? 'no board'}
                    <span className="block text-xs text-ink-soft">{s.operator?.name ?? 'unknown operator'}</span>
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </section>
  );
}
