// A session's saved explanation (GET /api/sessions/:id/explanation): read by the session page, its
// printed report and the compare page, so they share one query and one record type. A session
// that was never explained reads as null rather than as an error.
import { queryOptions, useQueries, useQuery } from '@tanstack/react-query';
import type { Explanation } from '../../../shared/explain';
import type { ModelConfig } from '../../../shared/numeric/model-config';
import { api, ApiError } from '../api';

interface Person {
  id: number;
  name: string;
}

/** What the server saved (server/services/session-explanation.ts explanationReply). */
export interface StoredExplanation {
  sessionId: number;
  savedAt: string;
  savedBy: Person | null;
  decision: { choice: 'applied' | 'kept'; by: Person | null; at: string } | null;
  /** The configuration an engineer may still apply to the core, else null. */
  applicableConfig: ModelConfig | null;
  explanation: Explanation;
}

export const explanationKeys = {
  all: ['session-explanations'] as const,
  detail: (sessionId: number) => [...explanationKeys.all, sessionId] as const,
};

export async function getExplanation(sessionId: number, signal?: AbortSignal): Promise<StoredExplanation | null> {
  try {
    return await api<StoredExplanation>(`/api/sessions/${sessionId}/explanation`, { signal });
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
