import { useMutation, useQueryClient } from '@tanstack/react-query';
import { apiReply } from '../../../lib/api';
import { coreKeys } from '../../../lib/resources/cores';
import { explanationKeys } from '../../../lib/resources/explanations';
import { explanationDecisionReply, type ExplanationDecisionBody } from '../../../../shared/contract/session-explanation';

export type ExplanationChoice = ExplanationDecisionBody['decision'];

/** POST /api/sessions/:id/explanation/decision: apply the deviation to the core, or keep the core as declared. */
export const decideExplanation = (sessionId: number, decision: ExplanationChoice) =>
  apiReply(explanationDecisionReply, `/api/sessions/${sessionId}/explanation/decision`, { method: 'POST', body: { decision } });

export function useDecideExplanation(sessionId: number, coreId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (decision: ExplanationChoice) => decideExplanation(sessionId, decision),
    onSuccess: async (saved, decision) => {
      qc.setQueryData(explanationKeys.detail(sessionId), saved);
      // An applied deviation changes the core's model: every view of the core reads it again.
      if (decision === 'apply') await Promise.all([qc.invalidateQueries({ queryKey: coreKeys.detail(coreId) }), qc.invalidateQueries({ queryKey: coreKeys.lists() })]);
    },
  });
}
