// Acceptance limits and the verdict of a run. The keys are the server's core `limits` field
// (server/schemas/core.ts): a missing key is not checked; errors in output LSB, SFDR in dB.
import type { RunScore } from './run-score';
import { UsageError } from './run-options';

export { limitsSchema, type Limits, type LimitKey } from '../shared/link-engine/limits';
import { limitsSchema, type Limits, type LimitKey } from '../shared/link-engine/limits';

export function parseLimits(input: unknown, where: string): Limits {
  const r = limitsSchema.safeParse(input);
  if (r.success) return r.data;
  const issue = r.error.issues[0];
  if (issue.code === 'unrecognized_keys') throw new UsageError(`${where}: "${issue.keys[0]}" is not a limit (known: ${Object.keys(limitsSchema.shape).join(', ')})`);
  throw new UsageError(`${where}: ${issue.path.map(String).join('.') || 'limits'} ${issue.message}`);
}

export interface LimitCheck {
  key: LimitKey;
  limit: number;
  /** The measured value; null when the plan cannot measure it (SFDR needs a tone plan). */
  value: number | null;
  /** 'skip': not measured by this plan, so it neither passes nor fails the run. */
  outcome: 'pass' | 'fail' | 'skip';
  note?: string;
}

export interface Verdict {
  passed: boolean;
  checks: LimitCheck[];
}

/** What each limit measures, and which way it must go. */
/** What a run measured beyond its score: a soak's unstable codes. */
export interface RunExtras {
  unstableCodes?: number;
}

const NOT_ROTATION = { max: true, value: () => null, note: 'a limit of vectoring cores' } as const;
const vectoringOnly = {
  maxAngleErrorLsb: NOT_ROTATION,
  maxAngleRmsLsb: NOT_ROTATION,
  maxMagnitudeErrorLsb: NOT_ROTATION,
  maxMagnitudeErrorPpm: NOT_ROTATION,
  minPlaneCoveragePct: { ...NOT_ROTATION, max: false },
};

const MEASURES: Record<LimitKey, { max: boolean; value: (s: RunScore, x: RunExtras) => number | null; note?: string }> = {
  maxAbsErrorLsb: { max: true, value: (s) => s.summary.overall.maxAbsLsb },
  maxRmsErrorLsb: { max: true, value: (s) => s.summary.overall.rmsLsb },
  maxAbsBiasLsb: { max: true, value: (s) => Math.max(Math.abs(s.summary.cos.meanLsb), Math.abs(s.summary.sin.meanLsb)) },
  minSfdrDb: { max: false, value: (s) => s.sfdrDb, note: 'needs a complete tone plan' },
  maxModelMismatches: { max: true, value: (s) => s.summary.mismatches.count },
  maxLinkErrors: { max: true, value: (s) => s.linkErrors },
  minCoveragePct: { max: false, value: (s) => s.summary.coverage.share * 100 },
  maxUnstableCodes: { max: true, value: (_s, x) => x.unstableCodes ?? null, note: 'needs a soak (--soak)' },
  // A rotation run measures none of the vectoring cores' limits.
  ...vectoringOnly,
};

/**
 * Every given limit against the score. A run with nothing answered fails every limit it could
 * measure: an empty run proves nothing.
 */
export function judge(score: RunScore, limits: Limits, extras: RunExtras = {}): Verdict {
  const checks: LimitCheck[] = [];
  for (const key of Object.keys(MEASURES) as LimitKey[]) {
    const limit = limits[key];
    if (limit === undefined) continue;
    const m = MEASURES[key];
    const value = m.value(score, extras);
    if (value === null) {
      checks.push({ key, limit, value, outcome: 'skip', note: m.note });
      continue;
    }
    const empty = score.summary.count === 0 && key !== 'maxLinkErrors';
    const ok = !empty && (m.max ? value <= limit : value >= limit);
    checks.push({ key, limit, value, outcome: ok ? 'pass' : 'fail', ...(empty ? { note: 'no results' } : {}) });
  }
  return { passed: checks.every((c) => c.outcome !== 'fail'), checks };
}
