import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { compareKeys } from './get-compare';

/** What the picker shows of a session. */
export interface RecentSession {
  id: number;
  startedAt: string;
  passed: boolean;
  sampleCount: number;
  build?: { id: number; label: string } | null;
  core?: { id: number; slug: string } | null;
}

/** The 30 latest sessions, of one core when `coreId` is set. */
export const getRecentSessions = async (coreId: number | null, signal?: AbortSignal) =>
  (await api<{ items: RecentSession[] }>(`/api/sessions?${coreId === null ? '' : `coreId=${coreId}&`}sort=-startedAt&pageSize=30`, { signal })).items;

export const recentSessionsQueryOptions = (coreId: number | null) =>
  queryOptions({ queryKey: compareKeys.recent(coreId), queryFn: ({ signal }) => getRecentSessions(coreId, signal) });

export const useRecentSessions = (coreId: number | null) => useQuery(recentSessionsQueryOptions(coreId));

/** The core of one session, for the picker before a comparison exists. */
export const getSessionCore = async (id: number, signal?: AbortSignal) =>
  (await api<{ session: { coreId: number } }>(`/api/sessions/${id}`, { signal })).session.coreId;

export const useSessionCore = (id: number | null) =>
  useQuery({ queryKey: ['sessions', 'detail', id, 'core'], queryFn: ({ signal }) => getSessionCore(id!, signal), enabled: id !== null });
