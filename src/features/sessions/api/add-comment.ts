import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { commentReply } from '../../../../shared/contract/misc';
import { apiReply } from '../../../lib/api';
import { sessionKeys } from '../../../lib/resources/sessions';

export const addCommentInput = z.object({ body: z.string().trim().min(1, 'Write something first').max(10_000, 'A comment is limited to 10,000 characters') });
export type AddCommentInput = z.infer<typeof addCommentInput>;

export const addComment = async (sessionId: number, input: AddCommentInput) =>
  (await apiReply(commentReply, `/api/sessions/${sessionId}/comments`, { method: 'POST', body: input })).comment;

export function useAddComment(sessionId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: AddCommentInput) => addComment(sessionId, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: sessionKeys.comments(sessionId) }),
  });
}
