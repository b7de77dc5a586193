import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';

export interface BuildItem {
  id: number;
  coreId: number;
  label: string;
}

export const buildKeys = { all: ['builds'] as const, ofCore: (coreId: number) => [...buildKeys.all, { coreId }] as const };

export const getBuilds = async (coreId: number, signal?: AbortSignal) =>
  (await api<{ builds: BuildItem[] }>(`/api/builds?coreId=${encodeURIComponent(coreId)}`, { signal })).builds;

export const buildsQueryOptions = (coreId: number) =>
  queryOptions({ queryKey: buildKeys.ofCore(coreId), queryFn: ({ signal }) => getBuilds(coreId, signal), staleTime: 30_000 });

/** The builds of a core; idle until a core is chosen. */
export const useBuilds = (coreId: number | null) => useQuery({ ...buildsQueryOptions(coreId ?? 0), enabled: coreId !== null });
