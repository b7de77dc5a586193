import { useMutation, useQueryClient } from '@tanstack/react-query';
import { coreReply } from '../../../../shared/contract/cores';
import { apiReply } from '../../../lib/api';
import type { CorePayload } from '../components/core-form-schema';
import { coreKeys } from '../../../lib/resources/cores';

export const createCore = async (body: CorePayload) => (await apiReply(coreReply, '/api/cores', { method: 'POST', body })).core;

export function useCreateCore() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createCore,
    onSuccess: () => qc.invalidateQueries({ queryKey: coreKeys.all }),
  });
}
