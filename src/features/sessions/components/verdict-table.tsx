import type { Verdict } from '../../../lib/resources/sessions';
import { formatNumber, verdictRows, type Outcome } from './verdict-rows';

const OUTCOME: Record<Outcome, { words: string; cls: string }> = {
  pass: { words: 'Pass', cls: 'text-pass' },
  fail: { words: 'Fail', cls: 'text-fail' },
  'not measured': { words: 'Not measured', cls: 'text-ink-soft' },
};

/** The verdict per limit: limit, measured, margin, outcome. */
export function VerdictTable({ verdict }: { verdict: Verdict }) {
  const rows = verdictRows(verdict);
  if (!rows.length) return <p className="text-sm text-ink-soft">The core had no limits set when this session was judged.</p>;
  return (
    <table className="w-full text-left text-sm" aria-label="Verdict per limit">
      <thead>
        <tr className="border-b border-rule text-xs uppercase tracking-wider text-ink-soft">
          <th scope="col" className="py-1 pr-3 font-bold">Limit</th>
          <th scope="col" className="py-1 pr-3 font-bold">Required</th>
          <th scope="col" className="py-1 pr-3 text-right font-bold">Measured</th>
          <th scope="col" className="py-1 pr-3 text-right font-bold">Margin</th>
          <th scope="col" className="py-1 font-bold">Outcome</th>
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r.key} className="border-b border-rule/60 last:border-0" data-testid={`verdict-${r.key}`}>
            <th scope="row" className="py-1 pr-3 font-normal">{r.name}</th>
            <td className="py-1 pr-3">{r.limitWords}</td>
            <td className="py-1 pr-3 text-right font-mono">{r.measured === null ? '—' : `${formatNumber(r.measured)}${r.unit ? ` ${r.unit}` : ''}`}</td>
            <td className={`py-1 pr-3 text-right font-mono ${r.margin !== null && r.margin < 0 ? 'text-fail' : ''}`}>{r.margin === null ? '—' : `${r.margin > 0 ? '+' : ''}${formatNumber(r.margin)}`}</td>
            <td className={`py-1 font-bold ${OUTCOME[r.outcome].cls}`}>{OUTCOME[r.outcome].words}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
