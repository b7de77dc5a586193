import { LIMIT_MEANINGS } from '../../../../shared/link-engine/limits';
import { panel, panelTitle } from '../../../components/ui';
import type { ComparedSession, LimitOutcome } from '../api/compare-types';
import { sessionName } from './chart-data';

// Limit names as the rest of the app words them.
const LIMITS: Record<string, { name: string; unit: string; atMost: boolean }> = LIMIT_MEANINGS;
const ORDER = Object.keys(LIMITS);
const num = (v: number) => v.toLocaleString('en-US', { maximumFractionDigits: 4 });

function Outcome({ o }: { o: LimitOutcome }) {
  if (o.pass === null) return <span className="text-ink-soft">not measured</span>;
  return <span className={`font-bold ${o.pass ? 'text-pass' : 'text-fail'}`}>{o.pass ? 'PASS' : 'FAIL'}</span>;
}

function SessionVerdict({ s }: { s: ComparedSession }) {
  const rows = Object.entries(s.verdict)
    .filter((e): e is [string, LimitOutcome] => e[1] !== undefined)
    .sort((p, q) => ORDER.indexOf(p[0]) - ORDER.indexOf(q[0]));
  return (
    <div className="min-w-0" data-testid={`verdict-${s.id}`}>
      <h3 className="font-bold">
        {sessionName(s)} <span className={s.passed ? 'text-pass' : 'text-fail'}>{s.passed ? 'PASS' : 'FAIL'}</span>
        {s.regression && <span className="ml-2 text-sm font-normal text-fail">regression against the baseline</span>}
      </h3>
      <p className="text-xs text-ink-soft">against the limits of {s.core.name ?? `core ${s.core.id}`}</p>
      {rows.length === 0 ? (
        <p className="text-sm text-ink-soft">The core has no limits set.</p>
      ) : (
        <table className="mt-1 w-full text-sm" aria-label={`Verdict of ${sessionName(s)}`}>
          <thead className="text-left text-xs text-ink-soft">
            <tr>
              <th scope="col" className="pr-3 font-bold">Limit</th>
              <th scope="col" className="pr-3 font-bold">Allowed</th>
              <th scope="col" className="pr-3 text-right font-bold">Measured</th>
              <th scope="col" className="font-bold">Outcome</th>
            </tr>
          </thead>
          <tbody>
            {rows.map(([key, o]) => {
              const meta = LIMITS[key] ?? { name: key, unit: '', atMost: true };
              const unit = meta.unit ? ` ${meta.unit}` : '';
              return (
                <tr key={key} className={`border-t border-rule/60 ${o.pass === false ? 'bg-fail-soft' : ''}`} data-testid={`verdict-${s.id}-${key}`}>
                  <td className="pr-3">{meta.name}</td>
                  <td className="pr-3">
                    {meta.atMost ? 'at most' : 'at least'} {num(o.limit)}
                    {unit}
                  </td>
                  <td className="pr-3 text-right font-mono text-xs">{o.measured === null ? '—' : `${num(o.measured)}${unit}`}</td>
                  <td>
                    <Outcome o={o} />
                  </td>
                </tr>
              );
            })}
          </tbody>
        </table>
      )}
    </div>
  );
}

/** Each session judged against its own core's limits. */
export function VerdictsPanel({ sessions }: { sessions: ComparedSession[] }) {
  return (
    <section aria-labelledby="verdicts-title" className={panel}>
      <h2 id="verdicts-title" className={panelTitle}>
        Verdicts against the limits
      </h2>
      <div className="grid gap-4 md:grid-cols-2 2xl:grid-cols-3">
        {sessions.map((s) => (
          <SessionVerdict key={s.id} s={s} />
        ))}
      </div>
    </section>
  );
}
