import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { buildKeys } from './build-keys';
import type { BuildRecord } from './build-types';

/** Every build, newest first; of one core when `coreId` is set. */
export async function getBuilds(coreId: number | null, signal?: AbortSignal): Promise<BuildRecord[]> {
  const query = coreId === null ? '' : `?coreId=${encodeURIComponent(coreId)}`;
  return (await api<{ builds: BuildRecord[] }>(`/api/builds${query}`, { signal })).builds;
}

export const buildListQueryOptions = (coreId: number | null) =>
  queryOptions({ queryKey: buildKeys.list(coreId), queryFn: ({ signal }) => getBuilds(coreId, signal) });

export const useBuildList = (coreId: number | null) => useQuery(buildListQueryOptions(coreId));
