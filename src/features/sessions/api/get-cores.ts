import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { LOOKUP_STALE_MS, type CoreRecord } from './lookup-types';
import { lookupKeys } from './session-keys';

/** Every core, for the list's filter and the sparkline's limit line. */
export const coresQueryOptions = () =>
  queryOptions({ queryKey: lookupKeys.cores(), queryFn: async ({ signal }) => (await api<{ cores: CoreRecord[] }>('/api/cores', { signal })).cores, staleTime: LOOKUP_STALE_MS });
export const useCoreList = () => useQuery(coresQueryOptions());
