import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { coreKeys } from '../../../lib/resources/cores';

/** PUT (start) or DELETE (stop) /api/cores/:id/watch for the signed-in user. */
export const setWatching = (id: number, watch: boolean) => api<void>(`/api/cores/${id}/watch`, { method: watch ? 'PUT' : 'DELETE' });

export function useSetWatching(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (watch: boolean) => setWatching(id, watch),
    onSuccess: () => qc.invalidateQueries({ queryKey: coreKeys.detail(id) }),
  });
}
