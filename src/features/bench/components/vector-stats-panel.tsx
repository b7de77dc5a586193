import { panel, panelTitle } from '../../../components/ui';
import { vectorStatRows } from '../../../components/vector-stat-rows';
import type { BenchSnapshot } from '../live/bench-controller';
import { LinkFiguresList } from './link-figures-list';

const int = (v: number) => v.toLocaleString('en-US');

/** A vectoring run's figures: angle and magnitude statistics from the scoring worker, then what the link did. */
export function VectorStatsPanel({ run }: { run: BenchSnapshot['run'] }) {
  const s = run?.vectorSummary;
  const f = run?.figures;
  const mismatches = s?.mismatches.count ?? 0;
  return (
    <section aria-labelledby="stats-title" className={panel}>
      <h2 id="stats-title" className={panelTitle}>
        Figures
      </h2>
      {!s ? (
        <p className="text-sm text-ink-soft">Run a plan to see its figures.</p>
      ) : (
        <div className="grid gap-3">
          <p className={`rounded px-3 py-2 text-base font-bold ${mismatches ? 'bg-fail-soft text-fail' : 'bg-pass-soft text-pass'}`}>
            Model mismatches: <span data-testid="stat-mismatches">{int(mismatches)}</span>
            {mismatches ? <span className="font-normal"> (largest {s.mismatches.maxAbsDiffLsb} LSB)</span> : <span className="font-normal"> — every answer equals the model</span>}
          </p>
          <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm" data-testid="vector-stats">
            {vectorStatRows(s).map((r) => (
              <div key={r.key} className="contents">
                <dt className="text-ink-soft">{r.label}</dt>
                <dd className="font-mono" data-testid={r.key === 'count' ? 'stat-scored' : r.key === 'mismatches' ? undefined : `stat-${r.key}`}>
                  {r.value}
                </dd>
              </div>
            ))}
          </dl>
          {s.mismatches.first.length > 0 && (
            <table className="w-full text-left font-mono text-xs">
              <caption className="mb-1 text-left font-sans text-sm text-ink-soft">First mismatches</caption>
              <thead>
                <tr className="text-ink-soft">
                  <th className="font-normal">index</th>
                  <th className="font-normal">(x, y)</th>
                  <th className="font-normal">angle / model</th>
                  <th className="font-normal">magnitude / model</th>
                </tr>
              </thead>
              <tbody>
                {s.mismatches.first.slice(0, 5).map((m) => (
                  <tr key={m.index}>
                    <td>{m.index}</td>
                    <td>
                      ({m.x}, {m.y})
                    </td>
                    <td>
                      {m.angle} / {m.modelAngle}
                    </td>
                    <td>
                      {m.magnitude} / {m.modelMagnitude}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          )}
        </div>
      )}
      {f && <LinkFiguresList figures={f} />}
    </section>
  );
}
