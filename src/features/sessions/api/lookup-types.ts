// Cores, builds and boards as the sessions pages read them (server/routes/cores.ts, builds.ts, boards.ts).
import type { Limits } from '../../../../shared/bench/limits';
import type { ModelConfig } from '../../../../shared/numeric';

export interface CoreRecord {
  id: number;
  name: string;
  slug: string;
  modelConfig: ModelConfig;
  limits: Limits;
  linkProfile: Record<string, unknown>;
  baselineSessionId: number | null;
}

export interface BuildRecord {
  id: number;
  coreId: number;
  label: string;
  sourceRevision?: string;
  toolVersion?: string;
  clockMHz?: number;
  fileName?: string | null;
  fileSize?: number | null;
  sha256?: string | null;
}

export interface BoardRecord {
  id: number;
  name: string;
}

/** Lookups change rarely: a minute before asking again. */
export const LOOKUP_STALE_MS = 60_000;
