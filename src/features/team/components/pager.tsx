import { btn } from '../../../components/ui';

/** "41–60 of 212" with Newer/Older buttons, for lists the server pages by offset. */
export function Pager({ offset, limit, total, onChange, label }: { offset: number; limit: number; total: number; onChange: (offset: number) => void; label: string }) {
  if (total === 0) return null;
  const last = Math.min(total, offset + limit);
  return (
    <nav aria-label={label} className="flex items-center gap-3 text-sm">
      <span className="text-ink-soft">
        {(offset + 1).toLocaleString('en-US')}–{last.toLocaleString('en-US')} of {total.toLocaleString('en-US')}
      </span>
      <button type="button" className={btn} disabled={offset === 0} onClick={() => onChange(Math.max(0, offset - limit))}>
        Newer
      </button>
      <button type="button" className={btn} disabled={last >= total} onClick={() => onChange(offset + limit)}>
        Older
      </button>
    </nav>
  );
}
