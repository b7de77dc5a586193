import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiReply } from '../../../lib/api';
import { explanationKeys } from '../../../lib/resources/explanations';
import { explanationReply } from '../../../../shared/contract/session-explanation';

/** POST /api/sessions/:id/explanation: the server searches again from the stored samples and saves its own result. */
export const saveExplanation = (sessionId: number) => apiReply(explanationReply, `/api/sessions/${sessionId}/explanation`, { method: 'POST' });

export function useSaveExplanation(sessionId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: () => saveExplanation(sessionId),
    onSuccess: (saved) => qc.setQueryData(explanationKeys.detail(sessionId), saved),
  });
}
