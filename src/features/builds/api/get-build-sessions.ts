import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';

// Under the sessions root, which the Bench page's save invalidates, so a new run shows here.
const buildSessionsKey = (buildId: number) => ['sessions', 'of-build', buildId] as const;

/** The few fields of a session the build page lists. */
export interface BuildSessionItem {
  id: number;
  startedAt: string;
  passed: boolean;
  regression: boolean;
  sampleCount: number;
  board?: { id: number; name: string } | null;
  operator?: { id: number; name: string } | null;
  plan: { kind?: string };
}

const PAGE_SIZE = 100;

/** The latest sessions run on a build (at most 100), and how many there are in all. */
export async function getBuildSessions(buildId: number, signal?: AbortSignal) {
  return api<{ items: BuildSessionItem[]; total: number }>(`/api/sessions?buildId=${buildId}&sort=-startedAt&pageSize=${PAGE_SIZE}`, { signal });
}

export const buildSessionsQueryOptions = (buildId: number) =>
  queryOptions({ queryKey: buildSessionsKey(buildId), queryFn: ({ signal }) => getBuildSessions(buildId, signal) });

export const useBuildSessions = (buildId: number) => useQuery(buildSessionsQueryOptions(buildId));
