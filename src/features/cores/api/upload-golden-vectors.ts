import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { goldenVectorReply } from '../../../../shared/contract/misc';
import { apiReply } from '../../../lib/api';
import { coreKeys } from '../../../lib/resources/cores';

/** The upload form: a name and one chosen file (a file input's value is a FileList). */
export const uploadGoldenVectorsSchema = z.object({
  name: z.string().trim().min(1, 'Name the set (e.g. the simulation run it came from)').max(120, 'At most 120 characters'),
  files: z.custom<FileList>((v) => typeof FileList !== 'undefined' && v instanceof FileList && v.length === 1, 'Choose one CSV file'),
});
export type UploadGoldenVectorsForm = z.infer<typeof uploadGoldenVectorsSchema>;
export interface UploadGoldenVectorsInput {
  name: string;
  file: File;
}

/** POST /api/cores/:id/golden-vectors: a CSV of angle_code,cos_code,sin_code and a name. */
export async function uploadGoldenVectors(coreId: number, input: UploadGoldenVectorsInput) {
  const form = new FormData();
  form.set('name', input.name);
  form.set('file', input.file, input.file.name);
  return (await apiReply(goldenVectorReply, `/api/cores/${coreId}/golden-vectors`, { method: 'POST', body: form })).set;
}

export function useUploadGoldenVectors(coreId: number) {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: (input: UploadGoldenVectorsInput) => uploadGoldenVectors(coreId, input),
    onSuccess: () => qc.invalidateQueries({ queryKey: coreKeys.goldenVectors(coreId) }),
  });
}
