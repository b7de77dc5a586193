// The key figures of a vectoring core's score (shared/vectoring's VectorScoreSummary) as
// label/value pairs: the Bench page, the Session page and its report show the same words.
import type { VectorScoreSummary } from '../../shared/vectoring';

const n = (v: number | null | undefined, digits = 3) => (typeof v === 'number' && Number.isFinite(v) ? v.toFixed(digits) : '—');
const int = (v: number | null | undefined) => (typeof v === 'number' ? v.toLocaleString('en-US') : '—');
/** A percentage with enough digits to tell a small share from none. */
const pct = (share: number) => (share > 0 && share < 0.001 ? (share * 100).toPrecision(2) : (share * 100).toFixed(2));
const at = (w: { x: number; y: number } | null) => (w ? ` at (${w.x}, ${w.y})` : '');

export interface VectorStatRow {
  key: string;
  label: string;
  value: string;
}

/** Rows in reading order; empty for a summary without answers. */
export function vectorStatRows(s: VectorScoreSummary | null | undefined): VectorStatRow[] {
  if (!s || !s.angleLsb || !s.magnitudeLsb) return [];
  const c = s.coverage;
  return [
    { key: 'count', label: 'Scored pairs', value: int(s.count) },
    { key: 'angle-max', label: 'Largest |angle error|', value: `${n(s.angleLsb.maxAbs)} LSB${at(s.angleLsb.worst)}` },
    { key: 'angle-rms', label: 'Angle RMS / bias', value: `${n(s.angleLsb.rms)} / ${n(s.angleLsb.mean)} LSB` },
    { key: 'magnitude-max', label: 'Largest |magnitude error|', value: `${n(s.magnitudeLsb.maxAbs)} LSB${at(s.magnitudeLsb.worst)}` },
    { key: 'magnitude-rms', label: 'Magnitude RMS / bias', value: `${n(s.magnitudeLsb.rms)} / ${n(s.magnitudeLsb.mean)} LSB` },
    { key: 'magnitude-ppm', label: 'Magnitude error, largest / RMS', value: `${n(s.magnitudePpm.maxAbs, 1)} / ${n(s.magnitudePpm.rms, 1)} ppm` },
    { key: 'mismatches', label: 'Model mismatches', value: `${int(s.mismatches.count)}${s.mismatches.count ? ` (largest ${n(s.mismatches.maxAbsDiffLsb, 0)} LSB)` : ''}` },
    { key: 'coverage', label: 'Plane cells covered', value: `${pct(c.cells.share)} % of ${c.cellsPerAxis} × ${c.cellsPerAxis}` },
    { key: 'sectors', label: 'Directions covered', value: `${pct(c.sectors.share)} % of ${c.sectors.total} sectors` },
    { key: 'rings', label: 'Magnitude rings covered', value: `${pct(c.rings.share)} % of ${c.rings.total}` },
    // Distinct pairs are counted exactly only while x and y together have at most 24 bits.
    { key: 'distinct', label: 'Distinct pairs', value: c.distinct === null ? 'not counted (inputs wider than 12 + 12 bits)' : `${int(c.distinct)} of ${int(c.total)} (${pct(c.distinct / c.total)} %)` },
  ];
}
