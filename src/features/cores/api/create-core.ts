import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api';
import type { CorePayload } from '../components/core-form-schema';
import { coreKeys, type CoreRecord } from '../../../lib/resources/cores';

export const createCore = async (body: CorePayload) => (await api<{ core: CoreRecord }>('/api/cores', { method: 'POST', body })).core;

export function useCreateCore() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createCore,
    onSuccess: () => qc.invalidateQueries({ queryKey: coreKeys.all }),
  });
}
