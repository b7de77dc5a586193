import { useState, type FormEvent } from 'react';
import { btn, fieldError, input, label, panel, panelTitle } from '../../../components/ui';
import { useRecentSessions, useSessionCore } from '../api/get-recent-sessions';
import { MAX_COMPARED } from './compare-ids';
import { colourOf } from './chart-look';

const when = (iso: string) => new Date(iso).toISOString().slice(0, 16).replace('T', ' ');

/** Choose the sessions to compare: by id, or from the latest sessions of the first one's core. */
export function SessionPicker({ ids, coreId, onChange }: { ids: number[]; coreId: number | null; onChange: (ids: number[]) => void }) {
  const [typed, setTyped] = useState('');
  const [problem, setProblem] = useState<string | null>(null);
  // Before a comparison exists, the first session's core comes from the session itself.
  const firstCore = useSessionCore(coreId === null && ids.length > 0 ? ids[0] : null);
  const core = coreId ?? firstCore.data ?? null;
  const recent = useRecentSessions(core);
  const full = ids.length >= MAX_COMPARED;

  const add = (id: number) => {
    setProblem(null);
    if (ids.includes(id)) return setProblem(`Session #${id} is already chosen.`);
    if (full) return setProblem(`At most ${MAX_COMPARED} sessions can be compared at once.`);
    onChange([...ids, id]);
  };
  const addTyped = (e: FormEvent) => {
    e.preventDefault();
    const id = Number(typed.trim().replace(/^#/, ''));
    if (!Number.isInteger(id) || id <= 0) return setProblem('A session id is a whole number, such as 12.');
    add(id);
    setTyped('');
  };
  const choices = (recent.data ?? []).filter((s) => !ids.includes(s.id));

  return (
    <section aria-labelledby="picker-title" className={panel}>
      <h2 id="picker-title" className={panelTitle}>
        Sessions compared
      </h2>
      <ol className="mb-3 flex flex-wrap gap-2" aria-label="Chosen sessions">
        {ids.length === 0 && <li className="text-sm text-ink-soft">None yet.</li>}
        {ids.map((id, i) => (
          <li key={id} className="flex items-center gap-2 rounded border border-rule bg-paper py-1 pl-2 pr-1 text-sm">
            <span className="inline-block h-2 w-4 rounded-sm" style={{ background: colourOf(i) }} aria-hidden />
            <span className="font-bold">#{id}</span>
            {i === 0 ? <span className="text-xs text-ink-soft">reference</span> : (
              <button type="button" className="rounded px-1 text-xs underline hover:bg-signal-soft" onClick={() => onChange([id, ...ids.filter((x) => x !== id)])}>
                Make reference
              </button>
            )}
            <button type="button" className="rounded px-1.5 font-bold hover:bg-fail-soft" aria-label={`Remove session #${id}`} onClick={() => onChange(ids.filter((x) => x !== id))}>
              ×
            </button>
          </li>
        ))}
      </ol>
      <div className="flex flex-wrap items-end gap-4">
        <form onSubmit={addTyped} className="flex items-end gap-2" aria-label="Add a session by id">
          <label className={`${label} w-36`}>
            Session id
            <input className={input} inputMode="numeric" value={typed} onChange={(e) => setTyped(e.target.value)} placeholder="e.g. 12" disabled={full} />
          </label>
          <button type="submit" className={btn} disabled={full}>
            Add
          </button>
        </form>
        <label className={`${label} min-w-80 flex-1`}>
          {core === null ? 'Latest sessions' : 'Latest sessions of the same core'}
          <select
            className={input}
            value=""
            disabled={full || choices.length === 0}
            onChange={(e) => e.target.value && add(Number(e.target.value))}
          >
            <option value="">{recent.isPending ? 'Loading sessions…' : choices.length === 0 ? 'No other session' : 'Add one of these…'}</option>
            {choices.map((s) => (
              <option key={s.id} value={s.id}>
                #{s.id} · {s.core?.slug ?? ''} · {s.build?.label ?? 'no build'} · {when(s.startedAt)} · {s.passed ? 'PASS' : 'FAIL'} · {s.sampleCount.toLocaleString('en-US')} samples
              </option>
            ))}
          </select>
        </label>
      </div>
      {problem && (
        <p role="alert" className={`${fieldError} mt-2`}>
          {problem}
        </p>
      )}
      {recent.isError && <p className={`${fieldError} mt-2`}>The latest sessions could not be loaded: {recent.error.message}</p>}
    </section>
  );
}
