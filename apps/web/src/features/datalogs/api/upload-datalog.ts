import { useMutation, useQueryClient } from '@tanstack/react-query';
import { ApiError, type ItemResponse } from '../../../lib/api-client';
import { jobsRootKey } from '../../jobs/api/get-jobs';
import { datalogsRootKey, type Datalog } from './get-datalog';

export interface UploadDatalogInput {
  jobId: string;
  file: File;
  /** Called with 0–1 as the bytes leave the browser. */
  onProgress?: (fraction: number) => void;
}

function parseJson(text: string): unknown {
  try {
    return JSON.parse(text);
  } catch {
    // A proxy error page is HTML; the status still tells what happened.
    return null;
  }
}

/**
 * Multipart upload over XMLHttpRequest: fetch reports no upload progress, and a 90 MB log needs a real bar.
 * Errors come back as ApiError, like every other request.
 */
export function uploadDatalog({ jobId, file, onProgress }: UploadDatalogInput): Promise<ItemResponse<Datalog>> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', `/api/jobs/${encodeURIComponent(jobId)}/datalogs`);
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.withCredentials = true;
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable) onProgress?.(event.loaded / event.total);
    };
    xhr.onerror = () => reject(new ApiError(0, 'network_error', 'The server could not be reached. Check your connection and try again.'));
    xhr.onload = () => {
      const body = parseJson(xhr.responseText);
      if (xhr.status >= 200 && xhr.status < 300) return resolve(body as ItemResponse<Datalog>);
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
    const form = new FormData();
    form.append('file', file);
    xhr.send(form);
  });
}

export function useUploadDatalog() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: uploadDatalog,
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: datalogsRootKey });
      await queryClient.invalidateQueries({ queryKey: jobsRootKey });
    },
  });
}
