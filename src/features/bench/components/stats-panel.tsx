import type { BenchSnapshot } from '../live/bench-controller';
import { panel, panelTitle } from '../../../components/ui';
import { LinkFiguresList } from './link-figures-list';
import { ToneFigures } from './tone-figures';

const n = (v: number, digits = 3) => (Number.isFinite(v) ? v.toFixed(digits) : '—');
const int = (v: number) => v.toLocaleString('en-US');

/** The run's figures: error statistics from the scoring worker, then what the link did. */
export function StatsPanel({ run }: { run: BenchSnapshot['run'] }) {
  const s = run?.summary;
  const f = run?.figures;
  const rows: [string, string, string?][] = s
    ? [
        ['Scored', int(s.count)],
        ['Max |error| cos', `${n(s.cos.maxAbsLsb)} LSB`, s.cos.maxAbsDegrees != null ? `at ${n(s.cos.maxAbsDegrees, 4)}°` : undefined],
        ['Max |error| sin', `${n(s.sin.maxAbsLsb)} LSB`, s.sin.maxAbsDegrees != null ? `at ${n(s.sin.maxAbsDegrees, 4)}°` : undefined],
        ['RMS cos / sin', `${n(s.cos.rmsLsb)} / ${n(s.sin.rmsLsb)} LSB`],
        ['Bias cos / sin', `${n(s.cos.meanLsb)} / ${n(s.sin.meanLsb)} LSB`],
        ['Magnitude RMS', n(s.magnitude.rms * 1e6, 2) + ' ppm'],
        ['Coverage', `${n(s.coverage.share * 100, 2)} % of codes (${int(s.coverage.distinct)})`],
      ]
    : [];
  const mismatches = s?.mismatches.count ?? null;
  return (
    <section aria-labelledby="stats-title" className={panel}>
      <h2 id="stats-title" className={panelTitle}>
        Figures
      </h2>
      {run?.soak && <p className="mb-2 text-xs text-ink-soft">{run.state === 'finished' ? 'The soak’s last whole pass (the samples a save keeps).' : 'The pass under way; the soak’s own figures are beside the timeline.'}</p>}
      {!s ? (
        <p className="text-sm text-ink-soft">Run a plan to see its figures.</p>
      ) : (
        <div className="grid gap-3">
          <p className={`rounded px-3 py-2 text-base font-bold ${mismatches ? 'bg-fail-soft text-fail' : 'bg-pass-soft text-pass'}`}>
            Model mismatches: <span data-testid="stat-mismatches">{int(mismatches ?? 0)}</span>
            {mismatches ? <span className="font-normal"> (largest {s.mismatches.maxAbsDiffLsb} LSB)</span> : <span className="font-normal"> — every answer equals the model</span>}
          </p>
          <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
            {rows.map(([k, v, extra]) => (
              <div key={k} className="contents">
                <dt className="text-ink-soft">{k}</dt>
                <dd className="font-mono" data-testid={k === 'Scored' ? 'stat-scored' : undefined}>
                  {v} {extra && <span className="text-ink-soft">{extra}</span>}
                </dd>
              </div>
            ))}
          </dl>
          {run?.tone && <ToneFigures tone={run.tone} />}
          {s.mismatches.first.length > 0 && (
            <table className="w-full text-left font-mono text-xs">
              <caption className="mb-1 text-left font-sans text-sm text-ink-soft">First mismatches</caption>
              <thead>
                <tr className="text-ink-soft">
                  <th className="font-normal">index</th>
                  <th className="font-normal">code</th>
                  <th className="font-normal">cos / model</th>
                  <th className="font-normal">sin / model</th>
                </tr>
              </thead>
              <tbody>
                {s.mismatches.first.slice(0, 5).map((m) => (
                  <tr key={m.index}>
                    <td>{m.index}</td>
                    <td>{m.code}</td>
                    <td>
                      {m.cos} / {m.modelCos}
                    </td>
                    <td>
                      {m.sin} / {m.modelSin}
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
