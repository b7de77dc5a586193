import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { buildKeys } from './build-keys';

export interface CoreChoice {
  id: number;
  slug: string;
  name: string;
}

export const getCoreChoices = async (signal?: AbortSignal) => (await api<{ cores: CoreChoice[] }>('/api/cores', { signal })).cores;

/** The cores a build can belong to (filter and form). */
export const coreChoicesQueryOptions = () => queryOptions({ queryKey: buildKeys.cores(), queryFn: ({ signal }) => getCoreChoices(signal), staleTime: 60_000 });

export const useCoreChoices = () => useQuery(coreChoicesQueryOptions());
