import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { buildKeys } from './build-keys';
import type { BuildDetail } from './build-types';

export async function getBuild(id: number, signal?: AbortSignal): Promise<BuildDetail> {
  return (await api<{ build: BuildDetail }>(`/api/builds/${id}`, { signal })).build;
}

export const buildQueryOptions = (id: number) => queryOptions({ queryKey: buildKeys.detail(id), queryFn: ({ signal }) => getBuild(id, signal) });

export const useBuild = (id: number) => useQuery(buildQueryOptions(id));
