// One build with the other builds holding the same bitstream: read by the build's own page and
// by a session's report (for the bitstream's SHA-256), so both share one cached copy.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../api';
import { buildKeys, type BuildRecord } from './builds';

export interface BuildRef {
  id: number;
  label: string;
}

/** GET /api/builds/:id `build`: the record and the builds whose file has the same SHA-256. */
export interface BuildDetail extends BuildRecord {
  duplicates: BuildRef[];
}

export const getBuild = async (id: number, signal?: AbortSignal) => (await api<{ build: BuildDetail }>(`/api/builds/${id}`, { signal })).build;

// The app's default stale time, as the list (builds.ts): its status follows new sessions.
export const buildQueryOptions = (id: number) => queryOptions({ queryKey: buildKeys.detail(id), queryFn: ({ signal }) => getBuild(id, signal) });

/** Idle while `id` is null (a session page before the session says which build, or one without). */
export const useBuild = (id: number | null) => useQuery({ ...buildQueryOptions(id ?? 0), enabled: id !== null });
