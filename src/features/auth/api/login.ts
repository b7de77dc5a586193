import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { apiReply, setCsrfToken } from '../../../lib/api';
import { loginReply } from '../../../../shared/contract/people';
import { authKeys, type PublicUser } from './get-me';

export const loginInputSchema = z.object({
  email: z.email('Enter the e-mail address of your account').max(254),
  password: z.string().min(1, 'Enter your password').max(200),
});
export type LoginInput = z.infer<typeof loginInputSchema>;

export async function login(input: LoginInput): Promise<PublicUser> {
  const res = await apiReply(loginReply, '/api/auth/login', { method: 'POST', body: input });
  // The server regenerated the session; the old token died with it.
  setCsrfToken(res.csrfToken);
  return res.user;
}

export function useLogin() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: login,
    onSuccess: async (user) => {
      qc.setQueryData(authKeys.me(), user);
      await qc.invalidateQueries({ queryKey: authKeys.all });
    },
  });
}
