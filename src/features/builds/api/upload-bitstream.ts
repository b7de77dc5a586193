import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { z } from 'zod';
import { buildFileReply } from '../../../../shared/contract/builds';
import { checkContract } from '../../../../shared/contract/check';
import { ApiError, apiErrorOf, csrfTokenForWrites } from '../../../lib/api';
import { buildKeys } from '../../../lib/resources/builds';

/** The build's columns and the other builds whose bitstream has the same SHA-256. */
export type UploadReply = z.infer<typeof buildFileReply>;

export interface UploadInput {
  buildId: number;
  file: File;
  /** Share of the bytes sent so far, 0..1. */
  onProgress?: (share: number) => void;
}

// XMLHttpRequest rather than fetch: only it reports upload progress. Errors become ApiErrors
// just as api() makes them.
export async function uploadBitstream({ buildId, file, onProgress }: UploadInput): Promise<UploadReply> {
  const token = await csrfTokenForWrites();
  const form = new FormData();
  form.set('file', file, file.name);
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api/builds/${buildId}/file`);
    xhr.setRequestHeader('x-csrf-token', token);
    xhr.setRequestHeader('accept', 'application/json');
    xhr.upload.onprogress = (e) => e.lengthComputable && onProgress?.(e.loaded / e.total);
    xhr.onerror = () => reject(new ApiError(0, 'network', 'The server could not be reached. Is it running?'));
    xhr.onload = () => {
      let body: unknown;
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        body = undefined;
      }
      if (xhr.status >= 200 && xhr.status < 300) {
        // As apiReply does (this upload goes through XHR for its progress events).
        if (import.meta.env.DEV) checkContract(buildFileReply, body, `The reply to POST /api/builds/${buildId}/file`);
        return resolve(body as UploadReply);
      }
      reject(apiErrorOf(xhr.status, xhr.statusText, body));
    };
    xhr.send(form);
  });
}

export function useUploadBitstream() {
  const qc = useQueryClient();
  return useMutation({
    mutationFn: uploadBitstream,
    // The file changes this build and the duplicates shown on the other builds with the same hash.
    onSuccess: async () => {
      await qc.invalidateQueries({ queryKey: buildKeys.all });
    },
  });
}
