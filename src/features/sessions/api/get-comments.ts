import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { sessionKeys } from './session-keys';

export interface SessionComment {
  id: number;
  sessionId: number;
  authorId: number | null;
  body: string;
  createdAt: string;
  author?: { id: number; name: string } | null;
}

export const getComments = async (sessionId: number, signal?: AbortSignal) =>
  (await api<{ comments: SessionComment[] }>(`/api/sessions/${sessionId}/comments`, { signal })).comments;

export const commentsQueryOptions = (sessionId: number) =>
  queryOptions({ queryKey: sessionKeys.comments(sessionId), queryFn: ({ signal }) => getComments(sessionId, signal) });

export const useComments = (sessionId: number) => useQuery(commentsQueryOptions(sessionId));
