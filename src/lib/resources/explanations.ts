// A session's saved explanation (GET /api/sessions/:id/explanation): read by the session page, its
// printed report and the compare page, so they share one query and one record type. A session
// that was never explained reads as null rather than as an error.
import { queryOptions, useQueries, useQuery } from '@tanstack/react-query';
import { explanationReply, type StoredExplanation } from '../../../shared/contract/session-explanation';
import { apiReply, ApiError } from '../api';

export type { StoredExplanation };

export const explanationKeys = {
  all: ['session-explanations'] as const,
  detail: (sessionId: number) => [...explanationKeys.all, sessionId] as const,
};

export async function getExplanation(sessionId: number, signal?: AbortSignal): Promise<StoredExplanation | null> {
  try {
    return await apiReply(explanationReply, `/api/sessions/${sessionId}/explanation`, { signal });
  } catch (err) {
    if (err instanceof ApiError && err.status === 404 && err.code === 'not_found' && /^Explanation/.test(err.message)) return null;
    throw err;
  }
}

export const explanationQueryOptions = (sessionId: number) =>
  queryOptions({ queryKey: explanationKeys.detail(sessionId), queryFn: ({ signal }) => getExplanation(sessionId, signal) });

export const useExplanation = (sessionId: number) => useQuery(explanationQueryOptions(sessionId));

/** The saved explanations of several sessions, in their order. */
export const useExplanations = (sessionIds: number[]) => useQueries({ queries: sessionIds.map((id) => explanationQueryOptions(id)) });
