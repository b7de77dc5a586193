import { useMutation, useQueryClient } from '@tanstack/react-query';
import { coreReply } from '../../../../shared/contract/cores';
import { apiReply } from '../../../lib/api';
import type { CorePayload } from '../components/core-form-schema';
import { coreKeys } from '../../../lib/resources/cores';

/** What PATCH /api/cores/:id takes: any of the form's parts, or a baseline change. */
export type CorePatch = Partial<CorePayload> & { baselineSessionId?: number | null };

export const updateCore = async (id: number, body: CorePatch) =>
  (await apiReply(coreReply, `/api/cores/${id}`, { method: 'PATCH', body })).core;

export function useUpdateCore(id: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: CorePatch) => updateCore(id, body),
    onSuccess: () => qc.invalidateQueries({ queryKey: coreKeys.all }),
  });
}
