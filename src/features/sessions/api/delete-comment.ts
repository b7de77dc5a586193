import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { sessionKeys } from '../../../lib/resources/sessions';

export const deleteComment = (commentId: number) => api<void>(`/api/comments/${commentId}`, { method: 'DELETE' });

export function useDeleteComment(sessionId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: deleteComment,
    onSuccess: () => qc.invalidateQueries({ queryKey: sessionKeys.comments(sessionId) }),
  });
}
