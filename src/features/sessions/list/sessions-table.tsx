import { useTable, type RowSelectionState, type SortingState, type Updater } from '@tanstack/react-table';
import { useMemo } from 'react';
import type { SessionRecord } from '../../../lib/resources/sessions';
import { MAX_COMPARE, sessionColumns, tableFeaturesUsed } from './session-columns';
import { PAGE_SIZES, type SessionFilters, type SortKey } from './session-filters';
import { btn, input } from '../../../components/ui';

const apply = <T,>(u: Updater<T>, old: T): T => (typeof u === 'function' ? (u as (o: T) => T)(old) : u);

const sortingOf = (sort: SortKey): SortingState => [{ id: sort.replace('-', ''), desc: sort.startsWith('-') }];
const sortOf = (s: SortingState): SortKey => (s[0] ? (`${s[0].desc ? '-' : ''}${s[0].id}` as SortKey) : '-startedAt');

interface Props {
  items: SessionRecord[];
  total: number;
  filters: SessionFilters;
  onFilters: (patch: Partial<SessionFilters>) => void;
  selection: RowSelectionState;
  onSelection: (s: RowSelectionState) => void;
  limitOf: (coreId: number) => number | undefined;
}

/** One server page of sessions; sort and page live in the address bar, picks in the page. */
export function SessionsTable({ items, total, filters, onFilters, selection, onSelection, limitOf }: Props) {
  const columns = useMemo(() => sessionColumns(limitOf), [limitOf]);
  const picked = Object.keys(selection).length;
  const table = useTable({
    features: tableFeaturesUsed,
    columns,
    data: items,
    getRowId: (r) => String(r.id),
    manualSorting: true,
    manualPagination: true,
    enableMultiSort: false,
    enableSortingRemoval: false,
    rowCount: total,
    state: {
      sorting: sortingOf(filters.sort),
      pagination: { pageIndex: filters.page - 1, pageSize: filters.pageSize },
      rowSelection: selection,
    },
    onSortingChange: (u) => onFilters({ sort: sortOf(apply(u, sortingOf(filters.sort))) }),
    onPaginationChange: (u) => {
      const p = apply(u, { pageIndex: filters.page - 1, pageSize: filters.pageSize });
      onFilters({ page: p.pageSize !== filters.pageSize ? 1 : p.pageIndex + 1, pageSize: p.pageSize });
    },
    onRowSelectionChange: (u) => onSelection(apply(u, selection)),
    // At most MAX_COMPARE picks: the rest are locked until one is let go.
    enableRowSelection: (row) => row.getIsSelected() || picked < MAX_COMPARE,
  });

  const pageCount = Math.max(1, table.getPageCount());
  return (
    <div className="grid gap-2">
    <div className="overflow-x-auto rounded-lg border border-rule bg-panel">
      <table className="w-full text-left text-sm" aria-label="Bench sessions">
        <thead className="bg-paper">
          {table.getHeaderGroups().map((g) => (
            <tr key={g.id} className="border-b border-rule">
              {g.headers.map((h) => {
                const sorted = h.column.getIsSorted();
                return (
                  <th key={h.id} scope="col" className="whitespace-nowrap px-2 py-2 text-xs font-bold uppercase tracking-wider text-ink-soft" aria-sort={sorted ? (sorted === 'desc' ? 'descending' : 'ascending') : undefined}>
                    {h.column.getCanSort() ? (
                      <button type="button" className="inline-flex items-center gap-1 uppercase hover:text-ink" onClick={h.column.getToggleSortingHandler()}>
                        <table.FlexRender header={h} />
                        <span aria-hidden="true">{sorted === 'desc' ? '▼' : sorted === 'asc' ? '▲' : '↕'}</span>
                      </button>
                    ) : (
                      <table.FlexRender header={h} />
                    )}
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody>
          {table.getRowModel().rows.map((row) => (
            <tr key={row.id} data-testid="session-row" className={`border-b border-rule/60 last:border-0 hover:bg-signal-soft/40 ${row.getIsSelected() ? 'bg-signal-soft/60' : ''}`}>
              {row.getAllCells().map((cell) => (
                <td key={cell.id} className="px-2 py-1.5 align-middle">
                  <table.FlexRender cell={cell} />
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
      <nav aria-label="Pages of sessions" className="flex flex-wrap items-center gap-2 text-sm">
        <button type="button" className={btn} disabled={!table.getCanPreviousPage()} onClick={() => table.previousPage()}>
          Previous page
        </button>
        <span className="tabular-nums" aria-live="polite" data-testid="page-position">
          Page {filters.page} of {pageCount} · {total.toLocaleString('en-US')} {total === 1 ? 'session' : 'sessions'}
        </span>
        <button type="button" className={btn} disabled={!table.getCanNextPage()} onClick={() => table.nextPage()}>
          Next page
        </button>
        <label className="ml-auto flex items-center gap-2 whitespace-nowrap">
          Rows per page
          <select className={`${input} w-auto`} value={filters.pageSize} onChange={(e) => table.setPageSize(Number(e.target.value))}>
            {PAGE_SIZES.map((n) => (
              <option key={n} value={n}>
                {n}
              </option>
            ))}
          </select>
        </label>
      </nav>
    </div>
  );
}
