import type { BenchSnapshot } from '../live/bench-controller';
import { FiguresFrame, FigureRows, FirstMismatches, MismatchBanner, type FigureRow } from './figures-parts';
import { ToneFigures } from './tone-figures';

const n = (v: number, digits = 3) => (Number.isFinite(v) ? v.toFixed(digits) : '—');
const int = (v: number) => v.toLocaleString('en-US');

/** The run's figures: error statistics from the scoring worker, then what the link did. */
export function StatsPanel({ run }: { run: BenchSnapshot['run'] }) {
  const s = run?.summary;
  const rows: FigureRow[] = s
    ? [
        { label: 'Scored', value: int(s.count), testId: 'stat-scored' },
        { label: 'Max |error| cos', value: `${n(s.cos.maxAbsLsb)} LSB`, extra: s.cos.maxAbsDegrees != null ? `at ${n(s.cos.maxAbsDegrees, 4)}°` : undefined },
        { label: 'Max |error| sin', value: `${n(s.sin.maxAbsLsb)} LSB`, extra: s.sin.maxAbsDegrees != null ? `at ${n(s.sin.maxAbsDegrees, 4)}°` : undefined },
        { label: 'RMS cos / sin', value: `${n(s.cos.rmsLsb)} / ${n(s.sin.rmsLsb)} LSB` },
        { label: 'Bias cos / sin', value: `${n(s.cos.meanLsb)} / ${n(s.sin.meanLsb)} LSB` },
        { label: 'Magnitude RMS', value: n(s.magnitude.rms * 1e6, 2) + ' ppm' },
        { label: 'Coverage', value: `${n(s.coverage.share * 100, 2)} % of codes (${int(s.coverage.distinct)})` },
      ]
    : [];
  const note = run?.soak && <p className="mb-2 text-xs text-ink-soft">{run.state === 'finished' ? 'The soak’s last whole pass (the samples a save keeps).' : 'The pass under way; the soak’s own figures are beside the timeline.'}</p>;
  return (
    <FiguresFrame scored={!!s} note={note} figures={run?.figures}>
      {s && (
        <>
          <MismatchBanner count={s.mismatches.count} largestLsb={s.mismatches.maxAbsDiffLsb} />
          <FigureRows rows={rows} />
          {run?.tone && <ToneFigures tone={run.tone} />}
          <FirstMismatches
            headers={['index', 'code', 'cos / model', 'sin / model']}
            rows={s.mismatches.first.slice(0, 5).map((m) => ({ key: m.index, cells: [m.index, m.code, `${m.cos} / ${m.modelCos}`, `${m.sin} / ${m.modelSin}`] }))}
          />
        </>
      )}
    </FiguresFrame>
  );
}
