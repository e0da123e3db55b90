import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Datalog } from '@revloop/contract';
import type { ItemResponse } from '../../../lib/api-client';
import { uploadWithProgress } from '../../../lib/upload-with-progress';
import { jobsRootKey } from '../../jobs/api/get-jobs';
import { datalogsRootKey } from './get-datalog';

export interface UploadDatalogInput {
  jobId: string;
  file: File;
  /** Called with 0–1 as the bytes leave the browser. */
  onProgress?: (fraction: number) => void;
}

/** Uploads a log with a progress callback; the server answers 202 while it checks the log. */
export function uploadDatalog({ jobId, file, onProgress }: UploadDatalogInput): Promise<ItemResponse<Datalog>> {
  return uploadWithProgress<ItemResponse<Datalog>>(`/api/jobs/${encodeURIComponent(jobId)}/datalogs`, file, { onProgress });
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
