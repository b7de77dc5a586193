import { useState } from 'react';
import { Link } from 'react-router-dom';
import { btn, fieldError } from '../../../components/ui';
import type { SessionRecord } from '../../../lib/resources/sessions';
import { PAGE_SIZE, useBoardSessions } from '../api/get-board-sessions';

/** The verdict in words, never colour alone. */
function verdictWords(s: SessionRecord): string {
  if (s.passed) return 'Pass';
  return s.regression ? 'Fail — regression' : 'Fail';
}

const when = (iso: string) => new Date(iso).toLocaleString('en-GB', { day: 'numeric', month: 'short', year: 'numeric', hour: '2-digit', minute: '2-digit' });

/** Sessions run on one board, newest first, a page at a time. */
export function BoardSessions({ boardId }: { boardId: number }) {
  const [page, setPage] = useState(1);
  const q = useBoardSessions(boardId, page);
  if (q.isPending) return <p className="text-sm text-ink-soft">Loading sessions…</p>;
  if (q.isError) return <p role="alert" className={fieldError}>The sessions could not be loaded: {q.error.message}</p>;
  const { items, total } = q.data;
  if (total === 0) return <p className="text-sm text-ink-soft">No session has been run on this board yet.</p>;
  const pages = Math.max(1, Math.ceil(total / PAGE_SIZE));
  return (
    <div className="grid gap-3">
      <div className="overflow-x-auto">
        <table className="w-full text-sm" aria-label="Sessions on this board">
          <thead className="border-b border-rule text-left text-xs uppercase tracking-wider text-ink-soft">
            <tr>
              <th scope="col" className="px-3 py-2">Session</th>
              <th scope="col" className="px-3 py-2">Started</th>
              <th scope="col" className="px-3 py-2">Core</th>
              <th scope="col" className="px-3 py-2">Build</th>
              <th scope="col" className="px-3 py-2">Operator</th>
              <th scope="col" className="px-3 py-2 text-right">Results</th>
              <th scope="col" className="px-3 py-2">Verdict</th>
            </tr>
          </thead>
          <tbody>
            {items.map((s) => (
              <tr key={s.id} className="border-b border-rule/60 last:border-0">
                <td className="px-3 py-2">
                  <Link to={`/sessions/${s.id}`} className="font-bold underline">#{s.id}</Link>
                </td>
                <td className="px-3 py-2">{when(s.startedAt)}</td>
                <td className="px-3 py-2">{s.core?.name ?? `core ${s.coreId}`}</td>
                <td className="px-3 py-2 font-mono">{s.build?.label ?? '—'}</td>
                <td className="px-3 py-2">{s.operator?.name ?? '—'}</td>
                <td className="px-3 py-2 text-right font-mono">{s.sampleCount.toLocaleString('en-US')}</td>
                <td className={`px-3 py-2 font-bold ${s.passed ? 'text-pass' : 'text-fail'}`} data-testid="board-session-verdict">
                  {verdictWords(s)}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      <div className="flex items-center gap-3 text-sm">
        <span className="text-ink-soft">
          {total.toLocaleString('en-US')} session{total === 1 ? '' : 's'} · page {page} of {pages}
        </span>
        {pages > 1 && (
          <>
            <button type="button" className={btn} disabled={page <= 1} onClick={() => setPage((p) => p - 1)}>Newer</button>
            <button type="button" className={btn} disabled={page >= pages} onClick={() => setPage((p) => p + 1)}>Older</button>
          </>
        )}
      </div>
    </div>
  );
}
