// Builds as every page reads them: one record type, one key factory and one list query, so the
// builds register, the bench's build picker and the sessions filter share one copy of
// GET /api/builds and an upload or review anywhere refreshes all of them.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../api';

/** See server/services/build-status.ts for the rules. */
export type BuildStatus = 'untested' | 'passing' | 'failing' | 'approved' | 'rejected';

export interface Named {
  id: number;
  name: string;
}

/**
 * A build as GET /api/builds and GET /api/builds/:id return it (server/routes/builds.ts: the
 * model's columns, its core and author, and the standing derived from its sessions and reviews).
 */
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

/** Every query about builds lives under `buildKeys.all`, so invalidating it reaches all of them. */
export const buildKeys = {
  all: ['builds'] as const,
  lists: () => [...buildKeys.all, 'list'] as const,
  /** `null`: the builds of every core. */
  list: (coreId: number | null) => [...buildKeys.lists(), { coreId }] as const,
  details: () => [...buildKeys.all, 'detail'] as const,
  detail: (id: number) => [...buildKeys.details(), id] as const,
  reviews: (id: number) => [...buildKeys.detail(id), 'reviews'] as const,
};

/** Every build, newest first; of one core when `coreId` is set. */
export async function getBuilds(coreId: number | null, signal?: AbortSignal): Promise<BuildRecord[]> {
  const query = coreId === null ? '' : `?coreId=${encodeURIComponent(coreId)}`;
  return (await api<{ builds: BuildRecord[] }>(`/api/builds${query}`, { signal })).builds;
}

// The app's default stale time (src/lib/query-client.ts), not the minute of cores and boards: a
// build's status and session count follow every session saved (the Bench page's save invalidates
// the sessions, not the builds) or imported through the API, so a page opened later asks again.
export const buildsQueryOptions = (coreId: number | null) => queryOptions({ queryKey: buildKeys.list(coreId), queryFn: ({ signal }) => getBuilds(coreId, signal) });

/** The builds of one core, or of every core when `coreId` is null. */
export const useBuildList = (coreId: number | null) => useQuery(buildsQueryOptions(coreId));

/** The builds of one core; idle while no core is chosen (the bench's picker before a core is). */
export const useCoreBuilds = (coreId: number | null) => useQuery({ ...buildsQueryOptions(coreId ?? 0), enabled: coreId !== null });
