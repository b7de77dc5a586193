import { DataTable, type PlainColumn } from '../../../components/data-table';
import { useState } from 'react';
import { Link, useNavigate } from 'react-router-dom';
import { btnPrimary, fieldError, panel, panelTitle } from '../../../components/ui';
import { useBoards, type BoardRecord } from '../../../lib/resources/boards';
import { BoardForm } from './board-form';
import { StationsPanel } from './stations-panel';

const columns: PlainColumn<BoardRecord>[] = [
  {
    id: 'name',
    header: 'Board',
    accessorFn: (b) => b.name,
    cell: ({ row }) => (
      <Link to={`/boards/${row.original.id}`} className="font-bold underline decoration-rule underline-offset-2 hover:decoration-signal">
        {row.original.name}
      </Link>
    ),
  },
  { id: 'serial', header: 'Serial', accessorFn: (b) => b.serial, cell: ({ getValue }) => <span className="font-mono">{String(getValue() || '—')}</span> },
  { id: 'fpgaPart', header: 'FPGA part', accessorFn: (b) => b.fpgaPart || '—' },
  { id: 'adapter', header: 'UART adapter', accessorFn: (b) => b.adapter || '—' },
  { id: 'location', header: 'Location', accessorFn: (b) => b.location || '—' },
];

function BoardsTable({ boards }: { boards: BoardRecord[] }) {
  return <DataTable columns={columns} data={boards} />;
}

/** /boards: the register of bench boards; engineers add to it. */
export function BoardsPage({ canEdit }: { canEdit: boolean }) {
  const boards = useBoards();
  const navigate = useNavigate();
  const [adding, setAdding] = useState(false);
  return (
    <div className="grid gap-4">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <div>
          <h1 className="text-2xl font-bold">Boards</h1>
          <p className="text-sm text-ink-soft">The bench boards, the FPGA on each, the UART adapter wired to it and where it lives.</p>
        </div>
        {canEdit && !adding && (
          <button type="button" className={btnPrimary} onClick={() => setAdding(true)}>
            New board
          </button>
        )}
      </div>
      {canEdit && adding && (
        <section className={panel} aria-labelledby="new-board-title">
          <h2 id="new-board-title" className={panelTitle}>New board</h2>
          <BoardForm board={null} onDone={(b) => navigate(`/boards/${b.id}`)} onCancel={() => setAdding(false)} />
        </section>
      )}
      {boards.isPending && <p className="text-ink-soft">Loading boards…</p>}
      {boards.isError && <p role="alert" className={fieldError}>The boards could not be loaded: {boards.error.message}</p>}
      {boards.data?.length === 0 && <p className="text-ink-soft">No boards registered yet.</p>}
      {boards.data && boards.data.length > 0 && <BoardsTable boards={boards.data} />}
      <StationsPanel />
    </div>
  );
}
