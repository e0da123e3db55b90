import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CalibrationFileKind, CalibrationModule, UploadJobFileResponse } from '@revloop/contract';
import { uploadWithProgress } from '../../../lib/upload-with-progress';
import { jobsRootKey } from '../../jobs/api/get-jobs';
import { filesRootKey } from './get-job-files';

export interface UploadJobFileInput {
  jobId: string;
  file: File;
  module: CalibrationModule;
  kind: CalibrationFileKind;
  notes: string;
  /** Called with 0–1 as the bytes leave the browser. */
  onProgress?: (fraction: number) => void;
}

/** Uploads a calibration file with a progress callback. */
export function uploadJobFile({ jobId, file, module, kind, notes, onProgress }: UploadJobFileInput): Promise<UploadJobFileResponse> {
  return uploadWithProgress<UploadJobFileResponse>(`/api/jobs/${encodeURIComponent(jobId)}/files`, file, {
    fields: { module, kind, notes },
    onProgress,
  });
}

export function useUploadJobFile() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: uploadJobFile,
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: filesRootKey });
      // The job may have moved (first read → Ready), a revision draft may make it sendable, and its timeline grew.
      await queryClient.invalidateQueries({ queryKey: jobsRootKey });
    },
  });
}
