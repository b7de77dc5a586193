import { Link } from 'react-router-dom';
import { panel, panelTitle } from '../../../components/ui';
import { useBuildSessions } from '../api/get-build-sessions';
import { formatWhen } from './build-format';

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
      {sessions.data?.items.length === 0 && <p className="text-sm text-ink-soft">No session has run on this build yet.</p>}
      {sessions.data && sessions.data.items.length > 0 && (
        <table className="w-full text-sm" aria-label="Sessions on this build">
          <thead className="text-left text-xs uppercase tracking-wider text-ink-soft">
            <tr>
              <th scope="col" className="py-1 pr-3">Session</th>
              <th scope="col" className="py-1 pr-3">Ran</th>
              <th scope="col" className="py-1 pr-3">Verdict</th>
              <th scope="col" className="py-1 pr-3">Plan</th>
              <th scope="col" className="py-1 pr-3 text-right">Samples</th>
              <th scope="col" className="py-1 pr-3">Board</th>
              <th scope="col" className="py-1">Operator</th>
            </tr>
          </thead>
          <tbody>
            {sessions.data.items.map((s) => (
              <tr key={s.id} className="border-t border-rule/60">
                <td className="py-1 pr-3">
                  <Link to={`/sessions/${s.id}`} className="font-bold underline">
                    #{s.id}
                  </Link>
                </td>
                <td className="py-1 pr-3 whitespace-nowrap">{formatWhen(s.startedAt)}</td>
                <td className={`py-1 pr-3 font-bold ${s.passed ? 'text-pass' : 'text-fail'}`}>
                  {s.passed ? 'PASS' : 'FAIL'}
                  {s.regression && <span className="ml-1 font-normal">(regression)</span>}
                </td>
                <td className="py-1 pr-3">{s.plan?.kind ?? '—'}</td>
                <td className="py-1 pr-3 text-right font-mono text-xs">{s.sampleCount.toLocaleString('en-US')}</td>
                <td className="py-1 pr-3">{s.board?.name ?? '—'}</td>
                <td className="py-1">{s.operator?.name ?? '—'}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </section>
  );
}
