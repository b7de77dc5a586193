// A session's verdict per limit, in words: what each limit is, what was measured, and by how
// much it was met or missed (margin > 0: met with room; < 0: missed by that much).
import { LIMIT_MEANINGS } from '../../../../shared/link-engine/limits';
import type { LimitOutcome, Verdict } from '../../../lib/resources/sessions';

export const LIMIT_META: Record<string, { name: string; unit: string; atMost: boolean }> = LIMIT_MEANINGS;
const ORDER = Object.keys(LIMIT_META);

export type Outcome = 'pass' | 'fail' | 'not measured';

export interface VerdictRow {
  key: string;
  name: string;
  unit: string;
  /** "at most 4 LSB" */
  limitWords: string;
  limit: number;
  measured: number | null;
  margin: number | null;
  outcome: Outcome;
}

export const formatNumber = (v: number) => (Number.isInteger(v) ? v.toLocaleString('en-US') : v.toLocaleString('en-US', { maximumFractionDigits: 4 }));

function row(key: string, o: LimitOutcome): VerdictRow {
  const meta = LIMIT_META[key] ?? { name: key, unit: '', atMost: true };
  const unit = meta.unit ? ` ${meta.unit}` : '';
  const margin = o.measured === null ? null : meta.atMost ? o.limit - o.measured : o.measured - o.limit;
  return {
    key,
    name: meta.name,
    unit: meta.unit,
    limitWords: `${meta.atMost ? 'at most' : 'at least'} ${formatNumber(o.limit)}${unit}`,
    limit: o.limit,
    measured: o.measured,
    margin,
    outcome: o.pass === null || o.measured === null ? 'not measured' : o.pass ? 'pass' : 'fail',
  };
}

/** Rows in a fixed order (known limits first), whatever order the server's JSON had. */
export function verdictRows(verdict: Verdict | null | undefined): VerdictRow[] {
  const entries = Object.entries(verdict ?? {}).filter((e): e is [string, LimitOutcome] => e[1] !== undefined && e[1] !== null);
  const rank = (k: string) => (ORDER.includes(k) ? ORDER.indexOf(k) : ORDER.length);
  return entries.sort(([a], [b]) => rank(a) - rank(b) || a.localeCompare(b)).map(([k, o]) => row(k, o));
}
