import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { api } from '../../../lib/api';
import { coreKeys } from '../../../lib/resources/cores';
import { sessionKeys } from './session-keys';
import type { SessionRecord } from './session-types';

/** What an engineer may change (server/routes/sessions.ts patchBody). */
export const updateSessionInput = z.object({
  notes: z.string().max(10_000, 'Notes are limited to 10,000 characters').optional(),
  tags: z.array(z.string().min(1).max(40, 'Each tag is at most 40 characters')).max(20, 'At most 20 tags').optional(),
  baseline: z.literal(true).optional(),
});
export type UpdateSessionInput = z.infer<typeof updateSessionInput>;

export const updateSession = async (id: number, body: UpdateSessionInput) =>
  (await api<{ session: SessionRecord }>(`/api/sessions/${id}`, { method: 'PATCH', body })).session;

export function useUpdateSession(id: number, coreId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: UpdateSessionInput) => updateSession(id, body),
    onSuccess: async (_s, body) => {
      // A new baseline changes the core: its list row and its detail, wherever they are shown.
      if (body.baseline) await Promise.all([qc.invalidateQueries({ queryKey: coreKeys.detail(coreId) }), qc.invalidateQueries({ queryKey: coreKeys.lists() })]);
      await Promise.all([qc.invalidateQueries({ queryKey: sessionKeys.detail(id) }), qc.invalidateQueries({ queryKey: sessionKeys.lists() })]);
    },
  });
}
