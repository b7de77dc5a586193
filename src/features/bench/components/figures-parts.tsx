// The Figures panel's parts, the same for both kinds of run: the frame (title, the figures of the
// link), the model-mismatch banner, the figure rows and the first mismatches. StatsPanel and
// VectorStatsPanel fill them with their own rows.
import type { ReactNode } from 'react';
import type { LinkFigures } from '../../../../shared/link-engine/link-figures';
import { panel, panelTitle } from '../../../components/ui';
import { LinkFiguresList } from './link-figures-list';

const int = (v: number) => v.toLocaleString('en-US');

/** The panel: its note, the run's own figures once there are any (`children`), then what the link did. */
export function FiguresFrame({ scored, note, figures, children }: { scored: boolean; note?: ReactNode; figures: LinkFigures | null | undefined; children: ReactNode }) {
  return (
    <section aria-labelledby="stats-title" className={panel}>
      <h2 id="stats-title" className={panelTitle}>
        Figures
      </h2>
      {note}
      {!scored ? <p className="text-sm text-ink-soft">Run a plan to see its figures.</p> : <div className="grid gap-3">{children}</div>}
      {figures && <LinkFiguresList figures={figures} />}
    </section>
  );
}

export function MismatchBanner({ count, largestLsb }: { count: number; largestLsb: number }) {
  return (
    <p className={`rounded px-3 py-2 text-base font-bold ${count ? 'bg-fail-soft text-fail' : 'bg-pass-soft text-pass'}`}>
      Model mismatches: <span data-testid="stat-mismatches">{int(count)}</span>
      {count ? <span className="font-normal"> (largest {largestLsb} LSB)</span> : <span className="font-normal"> — every answer equals the model</span>}
    </p>
  );
}

export interface FigureRow {
  label: string;
  value: string;
  /** Said after the value, softer (where the largest error was). */
  extra?: string;
  testId?: string;
}

export function FigureRows({ rows, testId }: { rows: FigureRow[]; testId?: string }) {
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm" data-testid={testId}>
      {rows.map((r) => (
        <div key={r.label} className="contents">
          <dt className="text-ink-soft">{r.label}</dt>
          <dd className="font-mono" data-testid={r.testId}>
            {r.value}
            {r.extra && (
              <>
                {' '}
                <span className="text-ink-soft">{r.extra}</span>
              </>
            )}
          </dd>
        </div>
      ))}
    </dl>
  );
}

/** The first few answers off the model, each row its cells under `headers`. */
export function FirstMismatches({ headers, rows }: { headers: string[]; rows: Array<{ key: number; cells: ReactNode[] }> }) {
  if (rows.length === 0) return null;
  return (
    <table className="w-full text-left font-mono text-xs">
      <caption className="mb-1 text-left font-sans text-sm text-ink-soft">First mismatches</caption>
      <thead>
        <tr className="text-ink-soft">
          {headers.map((h) => (
            <th key={h} className="font-normal">
              {h}
            </th>
          ))}
        </tr>
      </thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r.key}>
            {r.cells.map((c, k) => (
              <td key={k}>{c}</td>
            ))}
          </tr>
        ))}
      </tbody>
    </table>
  );
}
