// Words and links shared by the condition grid and the session panels.
import { CONDITION_RANGES, NAMED_CONDITIONS, type NamedCondition } from '../../../../shared/soak';
import type { CellVerdict } from '../../../../shared/contract/condition-grid';

export { NAMED_CONDITIONS };

export const conditionLabel = (name: string) => {
  const r = CONDITION_RANGES[name as NamedCondition];
  return r ? `${r.label} (${r.unit})` : name;
};

export const conditionUnit = (name: string) => CONDITION_RANGES[name as NamedCondition]?.unit ?? '';

/** The sessions list's filter names for each named condition (shared/contract/sessions.ts). */
const FILTER_PREFIX: Record<NamedCondition, string> = { temperature_c: 'temperature', vccint_v: 'vccint', clock_mhz: 'clock' };

/** The sessions list filtered to one build at exactly these condition values. */
export function sessionsAtLink(buildId: number, at: Array<[string, number]>): string {
  const p = new URLSearchParams({ build: String(buildId) });
  for (const [name, v] of at) {
    const prefix = FILTER_PREFIX[name as NamedCondition];
    p.set(`${prefix}Min`, String(v));
    p.set(`${prefix}Max`, String(v));
  }
  return `/sessions?${p}`;
}

export const VERDICT_WORDS: Record<CellVerdict, string> = { pass: 'PASS', fail: 'FAIL', unstable: 'UNSTABLE' };
export const VERDICT_CLASS: Record<CellVerdict, string> = {
  pass: 'bg-pass-soft text-pass',
  fail: 'bg-fail-soft text-fail',
  unstable: 'bg-signal-soft text-ink',
};
