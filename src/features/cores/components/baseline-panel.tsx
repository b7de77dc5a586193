import { Link } from 'react-router-dom';
import { btn, fieldError } from '../../../components/ui';
import { useSession } from '../../../lib/resources/sessions';
import { useUpdateCore } from '../api/update-core';
import { LIMITS } from './core-meanings';
import type { LimitKey } from '../../../../shared/link-engine/limits';

const num = (v: number) => v.toLocaleString('en-US', { maximumFractionDigits: 4 });

/** The session new ones are measured against; engineers may clear it (setting one is done from a session). */
export function BaselinePanel({ coreId, sessionId, canEdit }: { coreId: number; sessionId: number | null; canEdit: boolean }) {
  // The session's own detail query: its page and this panel share one copy.
  const session = useSession(sessionId);
  const update = useUpdateCore(coreId);
  if (sessionId === null) {
    return <p className="text-sm text-ink-soft">No baseline. Mark a passing session as the baseline from its session page.</p>;
  }
  const s = session.data;
  return (
    <div className="grid gap-2 text-sm">
      <p>
        <Link to={`/sessions/${sessionId}`} className="font-bold underline">
          Session #{sessionId}
        </Link>{' '}
        {s && (
          <>
            — <span className={`font-bold ${s.passed ? 'text-pass' : 'text-fail'}`}>{s.passed ? 'PASS' : 'FAIL'}</span>,{' '}
            {s.sampleCount.toLocaleString('en-US')} results, {new Date(s.startedAt).toLocaleDateString('en-GB', { day: 'numeric', month: 'short', year: 'numeric' })}
            {s.build ? `, build ${s.build.label}` : ''}
          </>
        )}
      </p>
      {session.isPending && <p className="text-ink-soft">Loading the baseline…</p>}
      {session.isError && <p role="alert" className={fieldError}>The baseline session could not be loaded: {session.error.message}</p>}
      {s && (
        <ul className="grid gap-0.5 text-xs" aria-label="Baseline verdict">
          {Object.entries(s.verdict).map(([key, o]) => {
            if (!o) return null;
            const meta = LIMITS[key as LimitKey];
            const word = o.pass === null ? 'not checked' : o.pass ? 'pass' : 'FAIL';
            return (
              <li key={key} className={o.pass === false ? 'text-fail' : 'text-ink-soft'}>
                {meta?.label ?? key}: {o.measured === null ? 'not measured' : num(o.measured)} ({meta?.bound ?? 'limit'} {num(o.limit)}) — {word}
              </li>
            );
          })}
        </ul>
      )}
      {canEdit && (
        <div>
          <button type="button" className={btn} disabled={update.isPending} onClick={() => update.mutate({ baselineSessionId: null })}>
            Clear baseline
          </button>
          {update.isError && <p role="alert" className={fieldError}>The baseline could not be cleared: {update.error.message}</p>}
        </div>
      )}
    </div>
  );
}
