// The cores, builds and boards the Sessions list filters by, and the one core or build a session
// page shows. Reviewer routes only.
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import type { ModelConfig } from '../../../../shared/numeric';
import type { Limits } from '../../../../shared/bench/limits';
import { lookupKeys } from './session-keys';

export interface CoreRecord {
  id: number;
  name: string;
  slug: string;
  modelConfig: ModelConfig;
  limits: Limits;
  linkProfile: Record<string, unknown>;
  baselineSessionId: number | null;
}

export interface BuildRecord {
  id: number;
  coreId: number;
  label: string;
  sourceRevision?: string;
  toolVersion?: string;
  clockMHz?: number;
  fileName?: string | null;
  fileSize?: number | null;
  sha256?: string | null;
}

export interface BoardRecord {
  id: number;
  name: string;
}

const long = 60_000;

export const coresQueryOptions = () =>
  queryOptions({ queryKey: lookupKeys.cores(), queryFn: async ({ signal }) => (await api<{ cores: CoreRecord[] }>('/api/cores', { signal })).cores, staleTime: long });
export const useCoreList = () => useQuery(coresQueryOptions());

export const coreQueryOptions = (id: number) =>
  queryOptions({ queryKey: lookupKeys.core(id), queryFn: async ({ signal }) => (await api<{ core: CoreRecord }>(`/api/cores/${id}`, { signal })).core, staleTime: long });
export const useCore = (id: number | null) => useQuery({ ...coreQueryOptions(id ?? 0), enabled: id !== null });

export const buildsQueryOptions = (coreId: number | null) =>
  queryOptions({
    queryKey: lookupKeys.builds(coreId),
    queryFn: async ({ signal }) => (await api<{ builds: BuildRecord[] }>(`/api/builds${coreId ? `?coreId=${coreId}` : ''}`, { signal })).builds,
    staleTime: long,
  });
export const useBuildList = (coreId: number | null) => useQuery(buildsQueryOptions(coreId));

export const buildQueryOptions = (id: number) =>
  queryOptions({ queryKey: lookupKeys.build(id), queryFn: async ({ signal }) => (await api<{ build: BuildRecord }>(`/api/builds/${id}`, { signal })).build, staleTime: long });
export const useBuild = (id: number | null) => useQuery({ ...buildQueryOptions(id ?? 0), enabled: id !== null });

export const boardsQueryOptions = () =>
  queryOptions({ queryKey: lookupKeys.boards(), queryFn: async ({ signal }) => (await api<{ boards: BoardRecord[] }>('/api/boards', { signal })).boards, staleTime: long });
export const useBoardList = () => useQuery(boardsQueryOptions());
