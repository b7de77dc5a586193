// Builds as the sessions pages read them (server/routes/builds.ts).

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

/** Builds change rarely: a minute before asking again. */
export const LOOKUP_STALE_MS = 60_000;
