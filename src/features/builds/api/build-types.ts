// What the builds API answers (server/routes/builds.ts), as the client reads it.

/** See server/services/build-status.ts for the rules. */
export type BuildStatus = 'untested' | 'passing' | 'failing' | 'approved' | 'rejected';

export interface Named {
  id: number;
  name: string;
}

export interface BuildRecord {
  id: number;
  coreId: number;
  core?: { id: number; name: string; slug: string };
  label: string;
  sourceRevision: string;
  toolVersion: string;
  clockMHz: number;
  notes: string;
  fileName: string | null;
  fileSize: number | null;
  sha256: string | null;
  createdById: number | null;
  createdBy?: Named | null;
  createdAt: string;
  updatedAt: string;
  status: BuildStatus;
  sessionCount: number;
  lastSessionAt: string | null;
}

export interface BuildRef {
  id: number;
  label: string;
}

/** A build as its own page reads it: with the other builds holding the same bitstream. */
export interface BuildDetail extends BuildRecord {
  duplicates: BuildRef[];
}

export interface ReviewRecord {
  id: number;
  buildId: number;
  reviewerId: number | null;
  reviewer?: Named | null;
  decision: 'approve' | 'reject';
  note: string;
  createdAt: string;
}
