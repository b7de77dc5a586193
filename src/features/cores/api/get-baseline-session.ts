import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';

/** Per limit: the limit, what the session measured, and whether it passed (null: not measurable). */
export interface LimitOutcome {
  limit: number;
  measured: number | null;
  pass: boolean | null;
}

/** The few fields of a session the core page shows for its baseline. */
export interface BaselineSession {
  id: number;
  passed: boolean;
  startedAt: string;
  sampleCount: number;
  verdict: Record<string, LimitOutcome | undefined>;
  build?: { id: number; label: string } | null;
}

export const getBaselineSession = async (id: number, signal?: AbortSignal) =>
  (await api<{ session: BaselineSession }>(`/api/sessions/${id}`, { signal })).session;

export const baselineSessionQueryOptions = (id: number) =>
  queryOptions({ queryKey: ['sessions', 'core-baseline', id] as const, queryFn: ({ signal }) => getBaselineSession(id, signal) });

export const useBaselineSession = (id: number | null) => useQuery({ ...baselineSessionQueryOptions(id ?? 0), enabled: id !== null });
