import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import { coreKeys } from '../../../lib/resources/cores';

export const deleteGoldenVectors = (coreId: number, setId: number) =>
  api<void>(`/api/cores/${coreId}/golden-vectors/${setId}`, { method: 'DELETE' });

export function useDeleteGoldenVectors(coreId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (setId: number) => deleteGoldenVectors(coreId, setId),
    onSuccess: () => qc.invalidateQueries({ queryKey: coreKeys.goldenVectors(coreId) }),
  });
}
