import { vectorStatRows } from '../../../components/vector-stat-rows';
import type { BenchSnapshot } from '../live/bench-controller';
import { FiguresFrame, FigureRows, FirstMismatches, MismatchBanner } from './figures-parts';

/** A vectoring run's figures: angle and magnitude statistics from the scoring worker, then what the link did. */
export function VectorStatsPanel({ run }: { run: BenchSnapshot['run'] }) {
  const s = run?.vectorSummary;
  return (
    <FiguresFrame scored={!!s} figures={run?.figures}>
      {s && (
        <>
          <MismatchBanner count={s.mismatches.count} largestLsb={s.mismatches.maxAbsDiffLsb} />
          <FigureRows
            testId="vector-stats"
            rows={vectorStatRows(s).map((r) => ({ label: r.label, value: r.value, testId: r.key === 'count' ? 'stat-scored' : r.key === 'mismatches' ? undefined : `stat-${r.key}` }))}
          />
          <FirstMismatches
            headers={['index', '(x, y)', 'angle / model', 'magnitude / model']}
            rows={s.mismatches.first.slice(0, 5).map((m) => ({ key: m.index, cells: [m.index, `(${m.x}, ${m.y})`, `${m.angle} / ${m.modelAngle}`, `${m.magnitude} / ${m.modelMagnitude}`] }))}
          />
        </>
      )}
    </FiguresFrame>
  );
}
