import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { LOOKUP_STALE_MS, type BuildRecord } from './lookup-types';
import { lookupKeys } from './session-keys';

/** One build, with its bitstream's SHA-256 when a file was uploaded. */
export const buildQueryOptions = (id: number) =>
  queryOptions({ queryKey: lookupKeys.build(id), queryFn: async ({ signal }) => (await api<{ build: BuildRecord }>(`/api/builds/${id}`, { signal })).build, staleTime: LOOKUP_STALE_MS });
export const useBuild = (id: number | null) => useQuery({ ...buildQueryOptions(id ?? 0), enabled: id !== null });
