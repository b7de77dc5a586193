import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';

export interface Health {
  status: 'ok' | 'degraded';
  version: string;
  database: { status: 'ok' | 'down'; dialect: string; migrations: number; message?: string };
  uptimeS: number;
}

export const healthKeys = { all: ['health'] as const };

export const getHealth = (signal?: AbortSignal) => api<Health>('/api/health', { signal });

export const healthQueryOptions = () =>
  queryOptions({ queryKey: healthKeys.all, queryFn: ({ signal }) => getHealth(signal), refetchInterval: 15_000 });

export const useHealth = () => useQuery(healthQueryOptions());
