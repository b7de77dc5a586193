import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, forgetCsrfToken } from '../../../lib/api';
import { authKeys } from './get-me';

export async function logout(): Promise<void> {
  await api<void>('/api/auth/logout', { method: 'POST' });
  forgetCsrfToken();
}

export function useLogout() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: logout,
    onSuccess: async () => {
      qc.setQueryData(authKeys.me(), null);
      // Everything cached belonged to the person who just left.
      qc.removeQueries({ predicate: (q) => q.queryKey[0] !== authKeys.all[0] });
      await qc.invalidateQueries({ queryKey: authKeys.all });
    },
  });
}
