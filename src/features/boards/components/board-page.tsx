import { useState } from 'react';
import { Link } from 'react-router-dom';
import { btn, fieldError, panel, panelTitle } from '../../../components/ui';
import { ApiError } from '../../../lib/api';
import { useBoard } from '../api/get-board';
import { BoardForm } from './board-form';
import { BoardSessions } from './board-sessions';

const DETAILS = [
  ['serial', 'Serial'],
  ['fpgaPart', 'FPGA part'],
  ['adapter', 'UART adapter'],
  ['location', 'Location'],
] as const;

/** /boards/:id: the board's register entry (editable by engineers) and the sessions run on it. */
export function BoardPage({ id, canEdit }: { id: number; canEdit: boolean }) {
  const q = useBoard(id);
  const [editing, setEditing] = useState(false);
  if (q.isPending) return <p className="text-ink-soft">Loading the board…</p>;
  if (q.isError) {
    return (
      <p role="alert" className={fieldError}>
        {q.error instanceof ApiError && q.error.status === 404 ? 'There is no such board.' : `The board could not be loaded: ${q.error.message}`}{' '}
        <Link to="/boards" className="underline">All boards</Link>
      </p>
    );
  }
  const board = q.data;
  return (
    <div className="grid gap-4">
      <div>
        <p className="text-sm"><Link to="/boards" className="underline">Boards</Link> /</p>
        <h1 className="text-2xl font-bold">{board.name}</h1>
      </div>
      <section className={panel} aria-labelledby="board-details">
        <h2 id="board-details" className={panelTitle}>Register entry</h2>
        {editing ? (
          <BoardForm board={board} onDone={() => setEditing(false)} onCancel={() => setEditing(false)} />
        ) : (
          <div className="grid gap-3">
            <dl className="grid gap-3 sm:grid-cols-4">
              {DETAILS.map(([key, term]) => (
                <div key={key}>
                  <dt className="text-xs uppercase tracking-wider text-ink-soft">{term}</dt>
                  <dd className={key === 'serial' ? 'font-mono' : undefined}>{board[key] || '—'}</dd>
                </div>
              ))}
            </dl>
            {canEdit && (
              <div>
                <button type="button" className={btn} onClick={() => setEditing(true)}>Edit board</button>
              </div>
            )}
          </div>
        )}
      </section>
      <section className={panel} aria-labelledby="board-sessions">
        <h2 id="board-sessions" className={panelTitle}>Sessions on this board</h2>
        <BoardSessions boardId={board.id} />
      </section>
    </div>
  );
}
