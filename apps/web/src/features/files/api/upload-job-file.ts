import { useMutation, useQueryClient } from '@tanstack/react-query';
import { ApiError } from '../../../lib/api-client';
import { jobsRootKey } from '../../jobs/api/get-jobs';
import { filesRootKey, type CalibrationFile, type CalibrationFileKind, type CalibrationModule } from './get-job-files';
import type { Verification } from './get-file-verification';

export interface UploadJobFileInput {
  jobId: string;
  file: File;
  module: CalibrationModule;
  kind: CalibrationFileKind;
  notes: string;
  /** Called with 0–1 as the bytes leave the browser. */
  onProgress?: (fraction: number) => void;
}

export interface UploadJobFileResponse {
  data: CalibrationFile;
  meta: { waitingFor: CalibrationModule[]; movedTo: string | null; verification: Verification | null };
}

function parseJson(text: string): unknown {
  try {
    return JSON.parse(text);
  } catch {
    // A proxy error page is HTML; the status still tells what happened.
    return null;
  }
}

/** Multipart upload over XMLHttpRequest, because fetch reports no upload progress. Errors come back as ApiError. */
export function uploadJobFile({ jobId, file, module, kind, notes, onProgress }: UploadJobFileInput): Promise<UploadJobFileResponse> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api/jobs/${encodeURIComponent(jobId)}/files`);
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.withCredentials = true;
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable) onProgress?.(event.loaded / event.total);
    };
    xhr.onerror = () => reject(new ApiError(0, 'network_error', 'The server could not be reached. Check your connection and try again.'));
    xhr.onload = () => {
      const body = parseJson(xhr.responseText);
      if (xhr.status >= 200 && xhr.status < 300) return resolve(body as UploadJobFileResponse);
      const error = (body as { error?: { code?: string; message?: string; details?: unknown } } | null)?.error;
      reject(
        new ApiError(
          xhr.status,
          error?.code ?? `http_${xhr.status}`,
          error?.message ?? (xhr.status === 413 ? 'The file is larger than this shop allows.' : `The server answered ${xhr.status}.`),
          error?.details,
        ),
      );
    };
    // Fields before the file, so the server knows the module and kind when the file arrives.
    const form = new FormData();
    form.append('module', module);
    form.append('kind', kind);
    form.append('notes', notes);
    form.append('file', file);
    xhr.send(form);
  });
}

export function useUploadJobFile() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: uploadJobFile,
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: filesRootKey });
      // The job may have moved (first read → Ready, revision → With customer) and its timeline grew.
      await queryClient.invalidateQueries({ queryKey: jobsRootKey });
    },
  });
}
