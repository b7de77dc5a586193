import { queryOptions, useQuery } from '@tanstack/react-query';
import { apiReply } from '../../../lib/api';
import { commentListReply, type SessionComment } from '../../../../shared/contract/misc';
import { sessionKeys } from '../../../lib/resources/sessions';

export type { SessionComment };

export const getComments = async (sessionId: number, signal?: AbortSignal) =>
  (await apiReply(commentListReply, `/api/sessions/${sessionId}/comments`, { signal })).comments;

export const commentsQueryOptions = (sessionId: number) =>
  queryOptions({ queryKey: sessionKeys.comments(sessionId), queryFn: ({ signal }) => getComments(sessionId, signal) });

export const useComments = (sessionId: number) => useQuery(commentsQueryOptions(sessionId));
