// /conditions: the shmoo plot of one build over two operating conditions, each cell a verdict
// linking to its sessions, and one figure against one condition as a line plot. Printable.
import { Link, useSearchParams } from 'react-router-dom';
import { btn, input, label, panel, panelTitle } from '../../../components/ui';
import { useBuildList } from '../../../lib/resources/builds';
import type { ConditionGrid } from '../../../../shared/contract/condition-grid';
import { useConditionGrid } from '../api/get-condition-grid';
import { conditionLabel, NAMED_CONDITIONS, sessionsAtLink, VERDICT_CLASS, VERDICT_WORDS } from './condition-words';
import { FigureLinePlot, FIGURES, type FigureKey } from './figure-line-plot';

const pick = <T extends string>(v: string | null, allowed: readonly T[], dflt: T): T => (v !== null && (allowed as readonly string[]).includes(v) ? (v as T) : dflt);

/** One axis's condition; choosing the other axis's condition swaps the two (the caller's onChange). */
function AxisSelect({ title, value, onChange }: { title: string; value: string; onChange: (condition: string) => void }) {
  return (
    <label className={label}>
      {title}
      <select className={input} value={value} onChange={(e) => onChange(e.target.value)}>
        {NAMED_CONDITIONS.map((n) => (
          <option key={n} value={n}>
            {conditionLabel(n)}
          </option>
        ))}
      </select>
    </label>
  );
}

export function ConditionGridPage() {
  const [params, setParams] = useSearchParams();
  const builds = useBuildList(null);
  const buildId = /^\d+$/.test(params.get('build') ?? '') ? Number(params.get('build')) : null;
  const x = pick(params.get('x'), NAMED_CONDITIONS, 'temperature_c');
  const y = pick(params.get('y'), NAMED_CONDITIONS.filter((n) => n !== x), x === 'vccint_v' ? 'temperature_c' : 'vccint_v');
  const figure = pick(params.get('figure'), Object.keys(FIGURES) as FigureKey[], 'maxAbsErrorLsb');
  const grid = useConditionGrid(buildId !== null ? { buildId, x, y } : null);
  const set = (patch: Record<string, string>) => {
    const p = new URLSearchParams(params);
    for (const [k, v] of Object.entries(patch)) p.set(k, v);
    setParams(p, { replace: true });
  };
  const build = builds.data?.find((b) => b.id === buildId);

  return (
    <div className="grid gap-4">
      <h1 className="text-3xl font-bold">Condition grid</h1>
      <p className="max-w-3xl text-ink-soft print:hidden">
        Every session of a build placed at the operating conditions it ran under: a cell passes when all its sessions passed, fails when one failed, and is unstable
        when a soak found codes whose answers changed between passes.
      </p>
      <form aria-label="Grid choices" className="grid grid-cols-2 items-end gap-3 rounded-lg border border-rule bg-panel p-3 md:grid-cols-4 print:hidden" onSubmit={(e) => e.preventDefault()}>
        <label className={label}>
          Build
          <select className={input} value={buildId ?? ''} onChange={(e) => set({ build: e.target.value })}>
            <option value="">Choose a build…</option>
            {builds.data?.map((b) => (
              <option key={b.id} value={b.id}>
                {b.core?.name ?? 'core'} — {b.label}
              </option>
            ))}
          </select>
        </label>
        <AxisSelect title="Across (x)" value={x} onChange={(v) => set(v === y ? { x: v, y: x } : { x: v })} />
        <AxisSelect title="Down (y)" value={y} onChange={(v) => set(v === x ? { y: v, x: y } : { y: v })} />
        <button type="button" className={btn} onClick={() => window.print()}>
          Print
        </button>
      </form>
      {build && (
        <p className="hidden print:block">
          {build.core?.name} — build {build.label}
        </p>
      )}
      {buildId === null && <p className="text-ink-soft">Choose a build to see its grid.</p>}
      {grid.isError && (
        <p role="alert" className="text-fail">
          The grid could not be read: {grid.error.message}
        </p>
      )}
      {grid.data && buildId !== null && (
        <>
          <GridTable grid={grid.data} buildId={buildId} />
          <section aria-labelledby="figure-title" className={panel}>
            <h2 id="figure-title" className={panelTitle}>
              One figure against {conditionLabel(grid.data.x)}
            </h2>
            <label className={`${label} mb-3 max-w-xs print:hidden`}>
              Figure
              <select className={input} value={figure} onChange={(e) => set({ figure: e.target.value })}>
                {(Object.keys(FIGURES) as FigureKey[]).map((f) => (
                  <option key={f} value={f}>
                    {FIGURES[f]}
                  </option>
                ))}
              </select>
            </label>
            <FigureLinePlot grid={grid.data} figure={figure} />
          </section>
        </>
      )}
    </div>
  );
}

function GridTable({ grid, buildId }: { grid: ConditionGrid; buildId: number }) {
  const unplaced = grid.sessions.filter((s) => s.x === null || s.y === null).length;
  if (grid.cells.length === 0) {
    return <p className="text-ink-soft">No session of this build records both {conditionLabel(grid.x)} and {conditionLabel(grid.y)}.</p>;
  }
  // Highest y at the top, as a plot reads.
  const ys = [...grid.ys].reverse();
  return (
    <section aria-labelledby="grid-title" className={panel}>
      <h2 id="grid-title" className={panelTitle}>
        Verdicts by {conditionLabel(grid.y)} and {conditionLabel(grid.x)}
      </h2>
      <div className="overflow-x-auto">
        <table className="border-collapse text-sm" aria-label="Condition grid">
          <thead>
            <tr>
              <th scope="col" className="p-2 text-left font-normal text-ink-soft">
                {conditionLabel(grid.y)} ↓ / {conditionLabel(grid.x)} →
              </th>
              {grid.xs.map((xv) => (
                <th key={xv} scope="col" className="p-2 text-center">
                  {xv}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {ys.map((yv) => (
              <tr key={yv}>
                <th scope="row" className="p-2 text-right">
                  {yv}
                </th>
                {grid.xs.map((xv) => {
                  const cell = grid.cells.find((c) => c.x === xv && c.y === yv);
                  if (!cell) return <td key={xv} className="border border-rule p-2 text-center text-ink-soft">—</td>;
                  const n = cell.sessionIds.length;
                  return (
                    <td key={xv} className={`border border-rule p-0 text-center ${VERDICT_CLASS[cell.verdict]}`}>
                      <Link
                        to={sessionsAtLink(buildId, [[grid.x, xv], [grid.y, yv]])}
                        className="block px-3 py-2 font-bold no-underline"
                        aria-label={`${VERDICT_WORDS[cell.verdict]} at ${conditionLabel(grid.x)} ${xv}, ${conditionLabel(grid.y)} ${yv}: ${n} session${n === 1 ? '' : 's'}`}
                      >
                        {VERDICT_WORDS[cell.verdict]}
                        <span className="block text-xs font-normal">
                          {n} session{n === 1 ? '' : 's'}
                        </span>
                      </Link>
                    </td>
                  );
                })}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
      {unplaced > 0 && (
        <p className="mt-2 text-sm text-ink-soft">
          {unplaced} session{unplaced === 1 ? '' : 's'} of this build record{unplaced === 1 ? 's' : ''} neither or only one of these conditions and {unplaced === 1 ? 'is' : 'are'} not placed.
        </p>
      )}
    </section>
  );
}
