// The list's operating-condition ranges: a minimum and a maximum per named condition, applied
// when the field is left or Enter is pressed (typing "-4" on the way to "-40" must not filter).
import { useState } from 'react';
import { input, label } from '../../../components/ui';
import type { SessionFilters } from './session-filters';

const RANGES = [
  { name: 'Temperature (°C)', min: 'temperatureMin', max: 'temperatureMax' },
  { name: 'Core supply (V)', min: 'vccintMin', max: 'vccintMax' },
  { name: 'Core clock (MHz)', min: 'clockMin', max: 'clockMax' },
] as const;

type Key = (typeof RANGES)[number]['min' | 'max'];

function Bound({ k, text, value, onFilters }: { k: Key; text: string; value: number | null; onFilters: (patch: Partial<SessionFilters>) => void }) {
  const [draft, setDraft] = useState(value === null ? '' : String(value));
  const [seen, setSeen] = useState(value);
  if (value !== seen) {
    // The address bar changed under us (a grid cell's link, Clear): follow it.
    setSeen(value);
    setDraft(value === null ? '' : String(value));
  }
  const apply = () => {
    const t = draft.trim();
    const n = t === '' ? null : Number(t);
    if (n === null || Number.isFinite(n)) onFilters({ [k]: n });
  };
  return (
    <label className={label}>
      {text}
      <input className={input} inputMode="decimal" value={draft} onChange={(e) => setDraft(e.target.value)} onBlur={apply} onKeyDown={(e) => e.key === 'Enter' && apply()} />
    </label>
  );
}

export function ConditionRangeFilters({ filters, onFilters }: { filters: SessionFilters; onFilters: (patch: Partial<SessionFilters>) => void }) {
  return (
    <>
      {RANGES.map((r) => (
        <fieldset key={r.min} className="col-span-2 grid grid-cols-2 gap-2">
          <legend className="text-sm">{r.name}</legend>
          <Bound k={r.min} text="at least" value={filters[r.min]} onFilters={onFilters} />
          <Bound k={r.max} text="at most" value={filters[r.max]} onFilters={onFilters} />
        </fieldset>
      ))}
    </>
  );
}
