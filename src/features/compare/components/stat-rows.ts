// The rows of the side-by-side statistics, and how a value compares with the first session's.
import type { CompareStats } from '../api/compare-types';

/** Which way is better: a lower value, a value nearer zero, or a higher one (null: neither). */
export type Better = 'lower' | 'nearer-zero' | 'higher' | null;

export interface StatRow {
  key: keyof CompareStats;
  name: string;
  unit: string;
  better: Better;
  /** Shown value from the stored one (e.g. radians as µrad). */
  scale?: number;
  digits: number;
}

export const STAT_ROWS: StatRow[] = [
  { key: 'count', name: 'Answers scored', unit: '', better: null, digits: 0 },
  { key: 'maxAbsErrorLsb', name: 'Largest |error|', unit: 'LSB', better: 'lower', digits: 3 },
  { key: 'cosMaxAbsLsb', name: 'Largest |error|, cos', unit: 'LSB', better: 'lower', digits: 3 },
  { key: 'sinMaxAbsLsb', name: 'Largest |error|, sin', unit: 'LSB', better: 'lower', digits: 3 },
  { key: 'rmsErrorLsb', name: 'RMS error', unit: 'LSB', better: 'lower', digits: 4 },
  { key: 'cosBiasLsb', name: 'Mean error (bias), cos', unit: 'LSB', better: 'nearer-zero', digits: 4 },
  { key: 'sinBiasLsb', name: 'Mean error (bias), sin', unit: 'LSB', better: 'nearer-zero', digits: 4 },
  { key: 'magnitudeMaxAbs', name: 'Largest magnitude error', unit: 'ppm of full scale', better: 'lower', scale: 1e6, digits: 2 },
  { key: 'phaseMaxAbsRad', name: 'Largest phase error', unit: 'µrad', better: 'lower', scale: 1e6, digits: 2 },
  { key: 'modelMismatches', name: 'Model mismatches', unit: '', better: 'lower', digits: 0 },
  { key: 'coveragePct', name: 'Code coverage', unit: '%', better: 'higher', digits: 3 },
];

/** The figures of vectoring sessions: angle errors in angle LSB, magnitude errors in magnitude LSB and ppm. */
export const VECTOR_STAT_ROWS: StatRow[] = [
  { key: 'count', name: 'Pairs scored', unit: '', better: null, digits: 0 },
  { key: 'angleMaxAbsLsb', name: 'Largest |angle error|', unit: 'LSB', better: 'lower', digits: 3 },
  { key: 'angleRmsLsb', name: 'RMS angle error', unit: 'LSB', better: 'lower', digits: 4 },
  { key: 'angleBiasLsb', name: 'Mean angle error (bias)', unit: 'LSB', better: 'nearer-zero', digits: 4 },
  { key: 'magnitudeMaxAbsLsb', name: 'Largest |magnitude error|', unit: 'LSB', better: 'lower', digits: 3 },
  { key: 'magnitudeRmsLsb', name: 'RMS magnitude error', unit: 'LSB', better: 'lower', digits: 4 },
  { key: 'magnitudeMaxAbsPpm', name: 'Largest relative magnitude error', unit: 'ppm', better: 'lower', digits: 1 },
  { key: 'modelMismatches', name: 'Model mismatches', unit: '', better: 'lower', digits: 0 },
  { key: 'coveragePct', name: 'Plane coverage', unit: '% of cells', better: 'higher', digits: 2 },
];

/** The rows for sessions of one mode (a comparison holds one mode). */
export const statRowsOf = (mode: 'rotation' | 'vectoring') => (mode === 'vectoring' ? VECTOR_STAT_ROWS : STAT_ROWS);

export const shown = (row: StatRow, v: number | null) => (v === null ? null : v * (row.scale ?? 1));

export function formatStat(row: StatRow, v: number | null): string {
  const s = shown(row, v);
  if (s === null) return '—';
  return s.toLocaleString('en-US', { maximumFractionDigits: row.digits });
}

export type DeltaVerdict = 'better' | 'worse' | 'same' | 'different';

/** How `v` compares with `first` (the first session's value), in words and a signed difference. */
export function compareStat(row: StatRow, first: number | null, v: number | null): { verdict: DeltaVerdict; delta: number } | null {
  const a = shown(row, first);
  const b = shown(row, v);
  if (a === null || b === null) return null;
  const delta = b - a;
  // Differences below the shown precision are no difference to the reader.
  if (Math.abs(delta) < 0.5 * 10 ** -row.digits) return { verdict: 'same', delta: 0 };
  if (row.better === null) return { verdict: 'different', delta };
  const gain = row.better === 'lower' ? -delta : row.better === 'higher' ? delta : Math.abs(a) - Math.abs(b);
  if (Math.abs(gain) < 0.5 * 10 ** -row.digits) return { verdict: 'same', delta };
  return { verdict: gain > 0 ? 'better' : 'worse', delta };
}
