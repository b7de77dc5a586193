import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, forgetCsrfToken } from '../../../lib/api';
import { authKeys } from './get-me';

export async function logout(): Promise<void> {
  await api<void>('/api/auth/logout', { method: 'POST' });
  forgetCsrfToken();
}

/**
 * Sign out, then `leave` (go to the sign-in form). The cache is emptied only once the page has
 * left: emptied under a page still showing, its queries would ask again and be refused (401).
 */
export function useLogout(leave: () => void | Promise<void>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: logout,
    onSuccess: async () => {
      const others = { predicate: (q: { queryKey: readonly unknown[] }) => q.queryKey[0] !== authKeys.all[0] };
      await qc.cancelQueries(others);
      qc.setQueryData(authKeys.me(), null);
      await leave();
      // Everything cached belonged to the person who just left.
      qc.removeQueries(others);
      await qc.invalidateQueries({ queryKey: authKeys.all });
    },
  });
}
