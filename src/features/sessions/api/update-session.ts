import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { coreKeys } from '../../../lib/resources/cores';
import { patchSession, sessionKeys } from '../../../lib/resources/sessions';

/** What an engineer may change, with the form's own messages (the contract's sessionPatchBody checks it again). */
export const updateSessionInput = z.object({
  notes: z.string().max(10_000, 'Notes are limited to 10,000 characters').optional(),
  tags: z.array(z.string().min(1).max(40, 'Each tag is at most 40 characters')).max(20, 'At most 20 tags').optional(),
  baseline: z.literal(true).optional(),
});
export type UpdateSessionInput = z.infer<typeof updateSessionInput>;

export function useUpdateSession(id: number, coreId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (body: UpdateSessionInput) => patchSession(id, body),
    onSuccess: async (_s, body) => {
      // A new baseline changes the core: its list row and its detail, wherever they are shown.
      if (body.baseline) await Promise.all([qc.invalidateQueries({ queryKey: coreKeys.detail(coreId) }), qc.invalidateQueries({ queryKey: coreKeys.lists() })]);
      await Promise.all([qc.invalidateQueries({ queryKey: sessionKeys.detail(id) }), qc.invalidateQueries({ queryKey: sessionKeys.lists() })]);
    },
  });
}
