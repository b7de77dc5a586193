import type { RowSelectionState } from '@tanstack/react-table';
import { useCallback, useMemo, useState } from 'react';
import { useNavigate, useSearchParams } from 'react-router-dom';
import { btn, btnPrimary } from '../../../components/ui';
import { useCores } from '../../../lib/resources/cores';
import { useSessions } from '../api/get-sessions';
import type { Named } from '../../../lib/resources/sessions';
import { MAX_COMPARE } from './session-columns';
import { activeFilterCount, DEFAULT_FILTERS, filtersFromSearch, filtersToSearch, withFilters, type SessionFilters } from './session-filters';
import { SessionsFilterBar } from './sessions-filter-bar';
import { SessionsTable } from './sessions-table';

/** The Sessions list: filters in the address bar, one server page at a time, picks to compare. */
export function SessionsPage() {
  const [params, setParams] = useSearchParams();
  const navigate = useNavigate();
  const filters = useMemo(() => filtersFromSearch(params), [params]);
  const setFilters = useCallback((patch: Partial<SessionFilters>) => setParams(filtersToSearch(withFilters(filters, patch))), [filters, setParams]);
  const sessions = useSessions(filters);
  const cores = useCores();
  const [selection, setSelection] = useState<RowSelectionState>({});

  // Operators met on any page so far (GET /api/users is for admins only).
  const [operators, setOperators] = useState<Named[]>([]);
  const fresh = (sessions.data?.items ?? []).flatMap((s) => (s.operator && !operators.some((o) => o.id === s.operator!.id) ? [s.operator] : []));
  if (fresh.length) setOperators([...operators, ...new Map(fresh.map((o) => [o.id, o])).values()].sort((a, b) => a.name.localeCompare(b.name)));
  const operatorChoices = filters.operatorId && !operators.some((o) => o.id === filters.operatorId) ? [...operators, { id: filters.operatorId, name: `operator #${filters.operatorId}` }] : operators;

  const limitOf = useCallback((coreId: number) => cores.data?.find((c) => c.id === coreId)?.limits.maxAbsErrorLsb, [cores.data]);
  const picked = Object.keys(selection).map(Number);
  const canCompare = picked.length >= 2 && picked.length <= MAX_COMPARE;
  const filtered = activeFilterCount(filters) > 0;

  return (
    <div className="grid gap-4">
      <div className="flex flex-wrap items-center gap-3">
        <h1 className="mr-auto text-2xl font-bold">Sessions</h1>
        <p className="text-sm text-ink-soft" aria-live="polite">
          {picked.length === 0 ? `Pick 2 to ${MAX_COMPARE} sessions to compare them.` : `${picked.length} picked${picked.length < 2 ? ': pick one more to compare' : ''}.`}
        </p>
        {picked.length > 0 && (
          <button type="button" className={btn} onClick={() => setSelection({})}>
            Clear picks
          </button>
        )}
        <button type="button" className={btnPrimary} disabled={!canCompare} onClick={() => navigate(`/compare?ids=${picked.join(',')}`)}>
          Compare selected
        </button>
      </div>
      <SessionsFilterBar filters={filters} onFilters={setFilters} operators={operatorChoices} />
      {sessions.isPending ? (
        <p className="text-ink-soft">Loading sessions…</p>
      ) : sessions.isError ? (
        <div role="alert" className="rounded border border-fail bg-fail-soft p-4">
          <p className="font-bold">The sessions could not be loaded.</p>
          <p className="text-sm">{sessions.error.message}</p>
        </div>
      ) : sessions.data.items.length === 0 ? (
        <div className="rounded-lg border border-rule bg-panel p-6">
          {filtered || filters.page > 1 ? (
            <>
              <p className="mb-3 font-bold">No sessions match these filters{filters.page > 1 ? ' on this page' : ''}.</p>
              <button type="button" className={btn} onClick={() => setFilters({ ...DEFAULT_FILTERS, sort: filters.sort, pageSize: filters.pageSize })}>
                Clear filters
              </button>
            </>
          ) : (
            <p>No sessions yet. Sessions saved from the Bench page, uploaded by the runner or imported appear here.</p>
          )}
        </div>
      ) : (
        <div className={sessions.isPlaceholderData ? 'opacity-60 transition-opacity' : ''} aria-busy={sessions.isFetching}>
          <SessionsTable items={sessions.data.items} total={sessions.data.total} filters={filters} onFilters={setFilters} selection={selection} onSelection={setSelection} limitOf={limitOf} />
        </div>
      )}
    </div>
  );
}
