import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { explanationKeys, type StoredExplanation } from '../../../lib/resources/explanations';

/** POST /api/sessions/:id/explanation: the server searches again from the stored samples and saves its own result. */
export const saveExplanation = (sessionId: number) => api<StoredExplanation>(`/api/sessions/${sessionId}/explanation`, { method: 'POST' });

export function useSaveExplanation(sessionId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => saveExplanation(sessionId),
    onSuccess: (saved) => qc.setQueryData(explanationKeys.detail(sessionId), saved),
  });
}
