// One build with the other builds holding the same bitstream: read by the build's own page and
// by a session's report (for the bitstream's SHA-256), so both share one cached copy.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { buildDetailReply, type BuildDetailReply } from '../../../shared/contract/builds';
import { apiReply } from '../api';
import { buildKeys } from './builds';

/** GET /api/builds/:id `build`: the record and the builds whose file has the same SHA-256. */
export type BuildDetail = BuildDetailReply['build'];
export type BuildRef = BuildDetail['duplicates'][number];

export const getBuild = async (id: number, signal?: AbortSignal) => (await apiReply(buildDetailReply, `/api/builds/${id}`, { signal })).build;

// The app's default stale time, as the list (builds.ts): its status follows new sessions.
export const buildQueryOptions = (id: number) => queryOptions({ queryKey: buildKeys.detail(id), queryFn: ({ signal }) => getBuild(id, signal) });

/** Idle while `id` is null (a session page before the session says which build, or one without). */
export const useBuild = (id: number | null) => useQuery({ ...buildQueryOptions(id ?? 0), enabled: id !== null });
