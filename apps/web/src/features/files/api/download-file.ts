import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CalibrationFile } from '@revloop/contract';
import { ApiError } from '../../../lib/api-client';
import { jobsRootKey } from '../../jobs/api/get-jobs';

export interface DownloadFileInput {
  file: Pick<CalibrationFile, 'id' | 'downloadName'>;
  onProgress?: (fraction: number) => void;
}

async function errorOf(xhr: XMLHttpRequest): Promise<ApiError> {
  const text = xhr.response instanceof Blob ? await xhr.response.text() : '';
  let error: { code?: string; message?: string } | undefined;
  try {
    error = (JSON.parse(text) as { error?: { code?: string; message?: string } }).error;
  } catch {
    error = undefined;
  }
  return new ApiError(xhr.status, error?.code ?? `http_${xhr.status}`, error?.message ?? `The download failed (${xhr.status}).`);
}

/**
 * Fetches the file over XMLHttpRequest for a real progress bar, then hands it to the browser as a download under the
 * name the server chose (Content-Disposition).
 */
export function downloadFile({ file, onProgress }: DownloadFileInput): Promise<void> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('GET', `/api/files/${encodeURIComponent(file.id)}/download`);
    xhr.responseType = 'blob';
    xhr.withCredentials = true;
    xhr.onprogress = (event) => {
      if (event.lengthComputable) onProgress?.(event.loaded / event.total);
    };
    xhr.onerror = () => reject(new ApiError(0, 'network_error', 'The server could not be reached. Check your connection and try again.'));
    xhr.onload = () => {
      if (xhr.status < 200 || xhr.status >= 300) {
        void errorOf(xhr).then(reject);
        return;
      }
      const url = URL.createObjectURL(xhr.response as Blob);
      const anchor = document.createElement('a');
      anchor.href = url;
      anchor.download = file.downloadName;
      document.body.append(anchor);
      anchor.click();
      anchor.remove();
      // Give the browser a moment to start the save before the blob goes away.
      setTimeout(() => URL.revokeObjectURL(url), 10_000);
      resolve();
    };
    xhr.send();
  });
}

export function useDownloadFile() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: downloadFile,
    // Every download is on the job's timeline.
    onSuccess: () => queryClient.invalidateQueries({ queryKey: jobsRootKey }),
  });
}
