import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { CalibrationFile } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { jobsRootKey } from '../../jobs/api/get-jobs';
import { filesRootKey } from './get-job-files';

/** Approves a revision draft (another tuner or the owner; never its uploader — the server decides). */
export const approveFile = (fileId: string) =>
  api.post<ItemResponse<CalibrationFile> & { meta: { jobInReach: boolean } }>(`/api/files/${encodeURIComponent(fileId)}/approve`, {});

export function useApproveFile() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: approveFile,
    onSuccess: async (response) => {
      // A reviewer from outside the job no longer sees it: only the board refreshes (the caller moves on).
      if (!response.meta.jobInReach) {
        await queryClient.invalidateQueries({ queryKey: [...jobsRootKey, 'list'] });
        return;
      }
      await queryClient.invalidateQueries({ queryKey: filesRootKey });
      // The board's badge, the job's Send revision move and its timeline follow the approval.
      await queryClient.invalidateQueries({ queryKey: jobsRootKey });
    },
  });
}
