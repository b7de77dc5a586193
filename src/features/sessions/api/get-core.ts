import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { LOOKUP_STALE_MS, type CoreRecord } from './lookup-types';
import { lookupKeys } from './session-keys';

/** One core: its model configuration, limits and baseline. */
export const coreQueryOptions = (id: number) =>
  queryOptions({ queryKey: lookupKeys.core(id), queryFn: async ({ signal }) => (await api<{ core: CoreRecord }>(`/api/cores/${id}`, { signal })).core, staleTime: LOOKUP_STALE_MS });
/** Idle until the session says which core. */
export const useCore = (id: number | null) => useQuery({ ...coreQueryOptions(id ?? 0), enabled: id !== null });
