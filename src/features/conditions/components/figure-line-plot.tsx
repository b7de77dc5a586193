// One figure of every placed session against one condition, a line per value of the other: drawn
// as SVG so it prints with the page.
import type { ConditionGrid } from '../../../../shared/contract/condition-grid';
import { conditionLabel } from './condition-words';

export const FIGURES = {
  maxAbsErrorLsb: 'Largest |error| (LSB)',
  unstableCodes: 'Unstable codes',
  mismatches: 'Model mismatches',
} as const;
export type FigureKey = keyof typeof FIGURES;

const W = 560;
const H = 240;
const PAD = { l: 56, r: 16, t: 12, b: 40 };
const SERIES = ['#c9821e', '#2f8b82', '#a8402f', '#1f2a2e', '#3b7d3a', '#7a5c9e'];

export function FigureLinePlot({ grid, figure }: { grid: ConditionGrid; figure: FigureKey }) {
  const placed = grid.sessions.filter((s) => s.x !== null && s.y !== null && s[figure] !== null);
  if (placed.length === 0) return <p className="text-ink-soft">No session of this build has both conditions and this figure.</p>;
  const xs = placed.map((s) => s.x!);
  const vs = placed.map((s) => s[figure]!);
  const [x0, x1] = [Math.min(...xs), Math.max(...xs)];
  const v1 = Math.max(1, ...vs);
  const px = (x: number) => PAD.l + (x1 === x0 ? 0.5 : (x - x0) / (x1 - x0)) * (W - PAD.l - PAD.r);
  const py = (v: number) => H - PAD.b - (v / v1) * (H - PAD.t - PAD.b);
  // One line per value of the other condition: the worst figure of its sessions at each x.
  const series = grid.ys.map((y, i) => {
    const byX = new Map<number, number>();
    for (const s of placed.filter((p) => p.y === y)) byX.set(s.x!, Math.max(byX.get(s.x!) ?? 0, s[figure]!));
    const points = [...byX.entries()].sort((a, b) => a[0] - b[0]);
    return { y, color: SERIES[i % SERIES.length], points };
  });
  return (
    <figure className="grid gap-2">
      <svg role="img" aria-label={`${FIGURES[figure]} against ${conditionLabel(grid.x)}`} viewBox={`0 0 ${W} ${H}`} className="w-full max-w-2xl">
        <line x1={PAD.l} y1={H - PAD.b} x2={W - PAD.r} y2={H - PAD.b} stroke="currentColor" strokeOpacity={0.4} />
        <line x1={PAD.l} y1={PAD.t} x2={PAD.l} y2={H - PAD.b} stroke="currentColor" strokeOpacity={0.4} />
        {[0, v1 / 2, v1].map((v) => (
          <text key={v} x={PAD.l - 6} y={py(v) + 4} textAnchor="end" fontSize={11}>
            {Number.isInteger(v) ? v : v.toFixed(1)}
          </text>
        ))}
        {[...new Set(xs)].map((x) => (
          <text key={x} x={px(x)} y={H - PAD.b + 16} textAnchor="middle" fontSize={11}>
            {x}
          </text>
        ))}
        <text x={(W + PAD.l) / 2} y={H - 6} textAnchor="middle" fontSize={12}>
          {conditionLabel(grid.x)}
        </text>
        {series.map((s) => (
          <g key={s.y}>
            <polyline fill="none" stroke={s.color} strokeWidth={2} points={s.points.map(([x, v]) => `${px(x)},${py(v)}`).join(' ')} />
            {s.points.map(([x, v]) => (
              <circle key={x} cx={px(x)} cy={py(v)} r={3.5} fill={s.color}>
                <title>{`${conditionLabel(grid.y)} ${s.y}, ${conditionLabel(grid.x)} ${x}: ${v}`}</title>
              </circle>
            ))}
          </g>
        ))}
      </svg>
      <figcaption className="flex flex-wrap gap-3 text-sm">
        {series.map((s) => (
          <span key={s.y} className="flex items-center gap-1">
            <span aria-hidden className="inline-block h-2 w-4" style={{ background: s.color }} />
            {conditionLabel(grid.y)} {s.y}
          </span>
        ))}
      </figcaption>
    </figure>
  );
}
