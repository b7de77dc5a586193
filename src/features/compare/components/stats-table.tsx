import { panel, panelTitle } from '../../../components/ui';
import type { ComparedSession } from '../api/compare-types';
import { sessionName } from './chart-data';
import { colourOf } from './chart-look';
import { compareStat, formatStat, statRowsOf, type StatRow } from './stat-rows';

const LOOK = { better: 'text-pass', worse: 'text-fail', same: 'text-ink-soft', different: 'text-ink' } as const;

function Delta({ row, first, value }: { row: StatRow; first: number | null; value: number | null }) {
  const c = compareStat(row, first, value);
  if (!c) return null;
  if (c.verdict === 'same') return <span className={`block text-xs ${LOOK.same}`}>= same</span>;
  const arrow = c.delta > 0 ? '▲' : '▼';
  const amount = `${c.delta > 0 ? '+' : '−'}${Math.abs(c.delta).toLocaleString('en-US', { maximumFractionDigits: row.digits })}`;
  return (
    <span className={`block whitespace-nowrap text-xs font-bold ${LOOK[c.verdict]}`}>
      {arrow} {amount} {c.verdict === 'different' ? '' : c.verdict}
    </span>
  );
}

/** The figures of every session side by side; each after the first with its change against the first. */
export function StatsTable({ sessions }: { sessions: ComparedSession[] }) {
  const first = sessions[0];
  return (
    <section aria-labelledby="compare-stats-title" className={`${panel} min-w-0`}>
      <h2 id="compare-stats-title" className={panelTitle}>
        Statistics
      </h2>
      <div className="overflow-x-auto">
        <table className="w-full text-sm" aria-label="Statistics side by side">
          <thead className="text-left text-xs text-ink-soft">
            <tr>
              <th scope="col" className="py-1 pr-4 uppercase tracking-wider">Figure</th>
              {sessions.map((s, i) => (
                <th key={s.id} scope="col" className="whitespace-nowrap py-1 pr-4 text-right">
                  <span className="mr-1 inline-block h-2 w-4 rounded-sm align-middle" style={{ background: colourOf(i) }} aria-hidden />
                  <span className="font-bold text-ink">{sessionName(s)}</span>
                  {i === 0 && <span className="block font-normal">the reference for changes</span>}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {statRowsOf(first.mode).map((row) => (
              <tr key={row.key} className="border-t border-rule/60" data-testid={`stat-row-${row.key}`}>
                <th scope="row" className="py-1 pr-4 text-left font-normal">
                  {row.name}
                  {row.unit && <span className="text-ink-soft">, {row.unit}</span>}
                </th>
                {sessions.map((s, i) => (
                  <td key={s.id} className="py-1 pr-4 text-right align-top font-mono text-xs">
                    {formatStat(row, s.stats[row.key])}
                    {i > 0 && <Delta row={row} first={first.stats[row.key]} value={s.stats[row.key]} />}
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </section>
  );
}
