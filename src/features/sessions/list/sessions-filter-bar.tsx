import { useState } from 'react';
import { btn, input, label } from '../../../components/ui';
import { useBoards } from '../../../lib/resources/boards';
import { useBuildList } from '../../../lib/resources/builds';
import { useCores } from '../../../lib/resources/cores';
import type { Named } from '../../../lib/resources/sessions';
import { activeFilterCount, DEFAULT_FILTERS, type SessionFilters } from './session-filters';
import { ConditionRangeFilters } from './condition-range-filters';

const idValue = (v: number | null) => (v === null ? '' : String(v));
const toId = (v: string) => (v === '' ? null : Number(v));

interface Props {
  filters: SessionFilters;
  onFilters: (patch: Partial<SessionFilters>) => void;
  /** Operators to offer: the list of users is for admins, so these come from the sessions seen. */
  operators: Named[];
}

/** Every filter applies at once and lands in the address bar; the tag on Enter or leaving it. */
export function SessionsFilterBar({ filters, onFilters, operators }: Props) {
  const cores = useCores();
  const builds = useBuildList(filters.coreId);
  const boards = useBoards();
  const [tag, setTag] = useState(filters.tag ?? '');
  const [seenTag, setSeenTag] = useState(filters.tag);
  if (filters.tag !== seenTag) {
    // The address bar changed under us (back button, Clear): follow it.
    setSeenTag(filters.tag);
    setTag(filters.tag ?? '');
  }
  const applyTag = () => onFilters({ tag: tag.trim() || null });
  const lookupError = cores.error ?? builds.error ?? boards.error;

  return (
    <form
      aria-label="Filter sessions"
      className="grid grid-cols-2 items-end gap-3 rounded-lg border border-rule bg-panel p-3 md:grid-cols-4 lg:grid-cols-5"
      onSubmit={(e) => {
        e.preventDefault();
        applyTag();
      }}
    >
      <label className={label}>
        Core
        <select className={input} value={idValue(filters.coreId)} onChange={(e) => onFilters({ coreId: toId(e.target.value), buildId: null })}>
          <option value="">Any core</option>
          {cores.data?.map((c) => (
            <option key={c.id} value={c.id}>
              {c.name}
            </option>
          ))}
        </select>
      </label>
      <label className={label}>
        Build
        <select className={input} value={idValue(filters.buildId)} onChange={(e) => onFilters({ buildId: toId(e.target.value) })}>
          <option value="">Any build</option>
          {builds.data?.map((b) => (
            <option key={b.id} value={b.id}>
              {b.label}
            </option>
          ))}
        </select>
      </label>
      <label className={label}>
        Board
        <select className={input} value={idValue(filters.boardId)} onChange={(e) => onFilters({ boardId: toId(e.target.value) })}>
          <option value="">Any board</option>
          {boards.data?.map((b) => (
            <option key={b.id} value={b.id}>
              {b.name}
            </option>
          ))}
        </select>
      </label>
      <label className={label}>
        Operator
        <select className={input} value={idValue(filters.operatorId)} onChange={(e) => onFilters({ operatorId: toId(e.target.value) })}>
          <option value="">Anyone</option>
          {operators.map((o) => (
            <option key={o.id} value={o.id}>
              {o.name}
            </option>
          ))}
        </select>
      </label>
      <label className={label}>
        Verdict
        <select className={input} value={filters.verdict ?? ''} onChange={(e) => onFilters({ verdict: (e.target.value || null) as SessionFilters['verdict'] })}>
          <option value="">Pass or fail</option>
          <option value="pass">Pass</option>
          <option value="fail">Fail</option>
        </select>
      </label>
      <label className={label}>
        Regression
        <select className={input} value={filters.regression === null ? '' : filters.regression ? 'yes' : 'no'} onChange={(e) => onFilters({ regression: e.target.value === '' ? null : e.target.value === 'yes' })}>
          <option value="">Either</option>
          <option value="yes">Regressions only</option>
          <option value="no">No regression</option>
        </select>
      </label>
      <label className={label}>
        Tag
        <input className={input} value={tag} placeholder="exact tag" onChange={(e) => setTag(e.target.value)} onBlur={applyTag} maxLength={40} />
      </label>
      <label className={label}>
        From
        <input type="date" className={input} value={filters.from ?? ''} onChange={(e) => onFilters({ from: e.target.value || null })} />
      </label>
      <label className={label}>
        To
        <input type="date" className={input} value={filters.to ?? ''} onChange={(e) => onFilters({ to: e.target.value || null })} />
      </label>
      <ConditionRangeFilters filters={filters} onFilters={onFilters} />
      <button type="button" className={btn} disabled={activeFilterCount(filters) === 0} onClick={() => onFilters({ ...DEFAULT_FILTERS, sort: filters.sort, pageSize: filters.pageSize })}>
        Clear filters
      </button>
      {lookupError && (
        <p role="alert" className="col-span-full text-sm text-fail">
          Some filter choices could not be loaded: {lookupError.message}
        </p>
      )}
    </form>
  );
}
