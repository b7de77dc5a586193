import { queryOptions, useQuery } from '@tanstack/react-query';
import { healthReply } from '../../../../shared/contract/misc';
import { apiReply } from '../../../lib/api';

export type { HealthReply as Health } from '../../../../shared/contract/misc';

export const healthKeys = { all: ['health'] as const };

export const getHealth = (signal?: AbortSignal) => apiReply(healthReply, '/api/health', { signal });

export const healthQueryOptions = () =>
  queryOptions({ queryKey: healthKeys.all, queryFn: ({ signal }) => getHealth(signal), refetchInterval: 15_000 });

export const useHealth = () => useQuery(healthQueryOptions());
