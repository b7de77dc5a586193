import type { ScoreSummary } from '../../../../shared/numeric';

const n = (v: number | undefined | null, digits = 3) => (typeof v === 'number' && Number.isFinite(v) ? v.toFixed(digits) : '—');
/** A percentage with enough digits to tell a small share from none. */
const pct = (share: number) => (share > 0 && share < 0.001 ? (share * 100).toPrecision(2) : (share * 100).toFixed(2));
const int = (v: number | undefined | null) => (typeof v === 'number' ? v.toLocaleString('en-US') : '—');

/** The key figures of a session's ScoreSummary, as label/value pairs. */
export function statRows(s: Partial<ScoreSummary>): [label: string, value: string][] {
  if (!s.cos || !s.sin || !s.overall) return [];
  const at = (d: number | null) => (d === null ? '' : ` at ${n(d, 4)}°`);
  return [
    ['Scored samples', int(s.count)],
    ['Largest |error|', `${n(s.overall.maxAbsLsb)} LSB`],
    ['Largest |error| cos', `${n(s.cos.maxAbsLsb)} LSB${at(s.cos.maxAbsDegrees)}`],
    ['Largest |error| sin', `${n(s.sin.maxAbsLsb)} LSB${at(s.sin.maxAbsDegrees)}`],
    ['RMS cos / sin', `${n(s.cos.rmsLsb)} / ${n(s.sin.rmsLsb)} LSB`],
    ['Bias cos / sin', `${n(s.cos.meanLsb)} / ${n(s.sin.meanLsb)} LSB`],
    ['Magnitude error RMS', s.magnitude ? `${n(s.magnitude.rms * 1e6, 2)} ppm` : '—'],
    ['Phase error RMS', s.phase ? `${n(s.phase.rmsRad * 1e6, 2)} µrad` : '—'],
    ['Model mismatches', s.mismatches ? `${int(s.mismatches.count)}${s.mismatches.count ? ` (largest ${s.mismatches.maxAbsDiffLsb} LSB)` : ''}` : '—'],
    ['Coverage', s.coverage ? `${pct(s.coverage.share)} % of codes (${int(s.coverage.distinct)})` : '—'],
  ];
}

export function SessionStats({ stats }: { stats: Partial<ScoreSummary> }) {
  const rows = statRows(stats);
  if (!rows.length) return <p className="text-sm text-ink-soft">No figures: the session holds no scored samples.</p>;
  return (
    <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-1 text-sm">
      {rows.map(([k, v]) => (
        <div key={k} className="contents">
          <dt className="text-ink-soft">{k}</dt>
          <dd className="font-mono">{v}</dd>
        </div>
      ))}
    </dl>
  );
}
