import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { LOOKUP_STALE_MS, type BuildRecord } from './lookup-types';
import { lookupKeys } from './session-keys';

/** The builds of a core, or of every core. */
export const buildsQueryOptions = (coreId: number | null) =>
  queryOptions({
    queryKey: lookupKeys.builds(coreId),
    queryFn: async ({ signal }) => (await api<{ builds: BuildRecord[] }>(`/api/builds${coreId ? `?coreId=${coreId}` : ''}`, { signal })).builds,
    staleTime: LOOKUP_STALE_MS,
  });
export const useBuildList = (coreId: number | null) => useQuery(buildsQueryOptions(coreId));
