import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Job } from '@revloop/contract';
import type { JobState } from '@revloop/domain/jobs';
import { api, type ItemResponse } from '../../../lib/api-client';
import { getNotificationsQueryOptions } from '../../notifications/api/get-notifications';
import { filesRootKey } from '../../files/api/get-job-files';
import { jobsRootKey } from './get-jobs';

/**
 * `kitOutOverride`: the owner marks a job dialed in although its rental kit is still out (the server checks who).
 * `note`: what changed, for Send revision (the customer reads it with the download).
 */
export const moveJob = ({ jobId, to, kitOutOverride, note }: { jobId: string; to: JobState; kitOutOverride?: boolean; note?: string }) =>
  api.post<ItemResponse<Job>>(`/api/jobs/${encodeURIComponent(jobId)}/transitions`, { to, ...(kitOutOverride && { kitOutOverride }), ...(note !== undefined && { note }) });

/** Moves a job by one of its allowed transitions; boards, lists and the job page refresh. */
export function useMoveJob() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: moveJob,
    onSettled: async () => {
      await queryClient.invalidateQueries({ queryKey: jobsRootKey });
      // Sending a revision turns drafts into sent files with their note.
      await queryClient.invalidateQueries({ queryKey: filesRootKey });
      await queryClient.invalidateQueries({ queryKey: getNotificationsQueryOptions().queryKey });
    },
  });
}
