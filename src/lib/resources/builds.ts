// Builds as every page reads them: one record type, one key factory and one list query, so the
// builds register, the bench's build picker and the sessions filter share one copy of
// GET /api/builds and an upload or review anywhere refreshes all of them.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { buildListReply } from '../../../shared/contract/builds';
import { apiReply } from '../api';

/**
 * A build as GET /api/builds and GET /api/builds/:id return it: the model's columns, its core and
 * author, and the standing derived from its sessions and reviews (server/services/build-status.ts).
 */
export type { BuildRecord, BuildStatus } from '../../../shared/contract/builds';
export type { Named } from '../../../shared/contract/common';

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
export async function getBuilds(coreId: number | null, signal?: AbortSignal) {
  const query = coreId === null ? '' : `?coreId=${encodeURIComponent(coreId)}`;
  return (await apiReply(buildListReply, `/api/builds${query}`, { signal })).builds;
}

// The app's default stale time (src/lib/query-client.ts), not the minute of cores and boards: a
// build's status and session count follow every session saved (the Bench page's save invalidates
// the sessions, not the builds) or imported through the API, so a page opened later asks again.
export const buildsQueryOptions = (coreId: number | null) => queryOptions({ queryKey: buildKeys.list(coreId), queryFn: ({ signal }) => getBuilds(coreId, signal) });

/** The builds of one core, or of every core when `coreId` is null. */
export const useBuildList = (coreId: number | null) => useQuery(buildsQueryOptions(coreId));

/** The builds of one core; idle while no core is chosen (the bench's picker before a core is). */
export const useCoreBuilds = (coreId: number | null) => useQuery({ ...buildsQueryOptions(coreId ?? 0), enabled: coreId !== null });
