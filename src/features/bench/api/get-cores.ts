import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';

export interface CoreItem {
  id: number;
  slug: string;
  name: string;
}

export const coreKeys = { all: ['cores'] as const };

export const getCores = async (signal?: AbortSignal) => (await api<{ cores: CoreItem[] }>('/api/cores', { signal })).cores;

export const coresQueryOptions = () => queryOptions({ queryKey: coreKeys.all, queryFn: ({ signal }) => getCores(signal), staleTime: 60_000 });

export const useCores = () => useQuery(coresQueryOptions());
