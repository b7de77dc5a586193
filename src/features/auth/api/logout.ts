import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, forgetCsrfToken } from '../../../lib/api';
import { authKeys } from './get-me';

export async function logout(): Promise<void> {
  await api<void>('/api/auth/logout', { method: 'POST' });
  forgetCsrfToken();
}

/** Every cached query but who is signed in: all of it belonged to the person leaving. */
const pageQueries = { predicate: (q: { queryKey: readonly unknown[] }) => q.queryKey[0] !== authKeys.all[0] };

/**
 * Sign out, then `leave` (go to the sign-in form). The page's fetches still under way are
 * cancelled before the sign-out is sent: one reaching the server after it would be refused (401)
 * and the browser would log it. The cache is emptied only once the page has left: emptied under a
 * page still showing, its queries would ask again and be refused.
 */
export function useLogout(leave: () => void | Promise<void>) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: logout,
    onMutate: () => qc.cancelQueries(pageQueries),
    onSuccess: async () => {
      await qc.cancelQueries(pageQueries);
      qc.setQueryData(authKeys.me(), null);
      await leave();
      qc.removeQueries(pageQueries);
      await qc.invalidateQueries({ queryKey: authKeys.all });
    },
  });
}
