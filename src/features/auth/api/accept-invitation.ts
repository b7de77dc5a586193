import { useMutation } from '@tanstack/react-query';
import { z } from 'zod';
import { apiReply } from '../../../lib/api';
import { userReply } from '../../../../shared/contract/people';
import type { PublicUser } from './get-me';
import { login } from './login';

export const acceptInputSchema = z
  .object({
    name: z.string().trim().min(1, 'Enter your name as colleagues should see it').max(120),
    password: z.string().min(8, 'At least 8 characters').max(200),
    confirm: z.string(),
  })
  .refine((v) => v.password === v.confirm, { path: ['confirm'], message: 'The two passwords differ' });
export type AcceptInput = z.infer<typeof acceptInputSchema>;

/** Create the invited account, then sign in with it. */
async function acceptInvitation(token: string, input: AcceptInput): Promise<PublicUser> {
  const { user } = await apiReply(userReply, '/api/invitations/accept', { method: 'POST', body: { token, name: input.name, password: input.password } });
  return login({ email: user.email, password: input.password });
}

export const useAcceptInvitation = (token: string) => useMutation({ mutationFn: (input: AcceptInput) => acceptInvitation(token, input) });
