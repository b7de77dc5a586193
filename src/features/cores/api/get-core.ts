import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { coreKeys, type CoreRecord } from './get-cores';

export interface Watcher {
  id: number;
  name: string;
}

/** GET /api/cores/:id: the core, who watches it, and whether the caller does. */
export interface CoreDetail {
  core: CoreRecord;
  watchers: Watcher[];
  watching: boolean;
}

export const getCore = (id: number, signal?: AbortSignal) => api<CoreDetail>(`/api/cores/${id}`, { signal });

export const coreQueryOptions = (id: number) => queryOptions({ queryKey: coreKeys.detail(id), queryFn: ({ signal }) => getCore(id, signal) });

export const useCore = (id: number) => useQuery(coreQueryOptions(id));
