import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { invitationReply, role } from '../../../../shared/contract/people';
import { apiReply } from '../../../lib/api';
import { teamKeys } from './keys';

export const invitationInputSchema = z.object({
  email: z.email('Enter an e-mail address').max(254, 'At most 254 characters'),
  name: z.string().trim().max(120, 'At most 120 characters'),
  role,
});
export type InvitationInput = z.infer<typeof invitationInputSchema>;

/** POST /api/invitations: `mailed` is false when the invitation was stored but the mail failed. */
export const createInvitation = (input: InvitationInput) =>
  apiReply(invitationReply, '/api/invitations', { method: 'POST', body: input });

export function useCreateInvitation() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createInvitation,
    // The mail lands in the outbox and the change in the audit log: refresh all team data.
    onSuccess: () => qc.invalidateQueries({ queryKey: teamKeys.all }),
  });
}
