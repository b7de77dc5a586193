import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { reviewReply } from '../../../../shared/contract/builds';
import { apiReply } from '../../../lib/api';
import { buildKeys } from '../../../lib/resources/builds';

export const reviewSchema = z.object({
  decision: z.enum(['approve', 'reject']),
  note: z.string().trim().max(10_000, 'The note is limited to 10,000 characters'),
});
export type ReviewInput = z.infer<typeof reviewSchema>;

/** A reviewer's decision; the server mails the build's author (`mailed` says whether it could). */
export const reviewBuild = (buildId: number, body: ReviewInput) =>
  apiReply(reviewReply, `/api/builds/${buildId}/reviews`, { method: 'POST', body });

export function useReviewBuild(buildId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: ReviewInput) => reviewBuild(buildId, body),
    // A decision changes the build's status in every list and its review trail: all of builds.
    onSuccess: async () => {
      await qc.invalidateQueries({ queryKey: buildKeys.all });
    },
  });
}
