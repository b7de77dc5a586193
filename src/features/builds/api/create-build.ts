import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { buildReply } from '../../../../shared/contract/builds';
import { apiReply } from '../../../lib/api';
import { buildKeys } from '../../../lib/resources/builds';

const text = (max: number, what: string) => z.string().trim().max(max, `${what} is limited to ${max} characters`);

/** The "New build" form as typed; the clock is text in the field and a number once parsed. */
export const newBuildSchema = z.object({
  coreId: z.string().min(1, 'Choose the core this bitstream implements'),
  label: text(120, 'The label').min(1, 'Give the build a label, e.g. ref16-r4'),
  sourceRevision: text(80, 'The source revision').min(1, 'Give the source revision (commit or tag)'),
  toolVersion: text(80, 'The tool version').min(1, 'Give the synthesis tool version'),
  clockMHz: z
    .string()
    .trim()
    .min(1, 'Give the clock in MHz')
    .refine((v) => Number.isFinite(Number(v)) && Number(v) > 0 && Number(v) <= 10_000, 'The clock is a number of MHz above 0 and at most 10,000'),
  notes: text(10_000, 'Notes'),
});
export type NewBuildForm = z.infer<typeof newBuildSchema>;

/** The new build's own columns (its standing comes with the next list or detail read). */
export async function createBuild(v: NewBuildForm) {
  const body = { coreId: Number(v.coreId), label: v.label, sourceRevision: v.sourceRevision, toolVersion: v.toolVersion, clockMHz: Number(v.clockMHz), notes: v.notes };
  return (await apiReply(buildReply, '/api/builds', { method: 'POST', body })).build;
}

export function useCreateBuild() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: createBuild,
    // Awaited, so the form opens the new build only once every builds list holds it.
    onSuccess: async () => {
      await qc.invalidateQueries({ queryKey: buildKeys.all });
    },
  });
}
