import { vectorStatRows } from '../../../components/vector-stat-rows';
import type { VectorScoreSummary } from '../../../../shared/vectoring';

/** The key figures of a vectoring session's stored score. */
export function VectorSessionStats({ stats }: { stats: VectorScoreSummary | undefined }) {
  const rows = vectorStatRows(stats);
  if (!rows.length) return <p className="text-sm text-ink-soft">No figures: the session holds no scored samples.</p>;
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm" data-testid="vector-stats">
      {rows.map((r) => (
        <div key={r.key} className="contents">
          <dt className="text-ink-soft">{r.label}</dt>
          <dd className="font-mono">{r.value}</dd>
        </div>
      ))}
    </dl>
  );
}
