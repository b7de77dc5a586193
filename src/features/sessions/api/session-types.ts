// What the sessions API answers (server/routes/sessions.ts), as the client reads it.
import type { Conditions, SoakRecord } from '../../../../shared/soak';
import type { ScoreSummary } from '../../../../shared/numeric';
import type { LimitKey } from '../../../../shared/link-engine/limits';

/** One limit's outcome; `measured` and `pass` are null when the server could not measure it. */
export interface LimitOutcome {
  limit: number;
  measured: number | null;
  pass: boolean | null;
}

export type Verdict = Partial<Record<LimitKey, LimitOutcome>>;

export interface Named {
  id: number;
  name: string;
}

/** A stored bench session without its sample and archive blobs. */
export interface SessionRecord {
  id: number;
  coreId: number;
  buildId: number | null;
  boardId: number | null;
  operatorId: number | null;
  core?: { id: number; name: string; slug: string };
  build?: { id: number; label: string } | null;
  board?: Named | null;
  operator?: Named | null;
  startedAt: string;
  endedAt: string | null;
  plan: Record<string, unknown>;
  transport: Record<string, unknown>;
  deviceInfo: Record<string, unknown> | null;
  /** The server's ScoreSummary; `{}` for a session stored without samples. */
  stats: Partial<ScoreSummary>;
  verdict: Verdict;
  passed: boolean;
  regression: boolean;
  sampleCount: number;
  /** 64 bins over the angle range, each the largest |error| in LSB; -1 where no sample fell. */
  profile?: number[] | null;
  notes: string;
  tags: string[];
  hasArchive?: boolean;
  /** Operating conditions (`{}` when none were recorded); a soak's pass count and unstable codes. */
  conditions?: Conditions;
  soakPasses?: number | null;
  unstableCodes?: number | null;
  /** The soak's books, in the detail only (null for a single-pass session). */
  soak?: SoakRecord | null;
  createdAt?: string;
  updatedAt?: string;
}

export interface SessionPage {
  items: SessionRecord[];
  total: number;
  page: number;
  pageSize: number;
}
