import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Job } from '@revloop/contract';
import type { JobState } from '@revloop/domain/jobs';
import { api, type ItemResponse } from '../../../lib/api-client';
import { getNotificationsQueryOptions } from '../../notifications/api/get-notifications';
import { jobsRootKey } from './get-jobs';

/** `kitOutOverride`: the owner marks a job dialed in although its rental kit is still out (the server checks who). */
export const moveJob = ({ jobId, to, kitOutOverride }: { jobId: string; to: JobState; kitOutOverride?: boolean }) =>
  api.post<ItemResponse<Job>>(`/api/jobs/${encodeURIComponent(jobId)}/transitions`, { to, ...(kitOutOverride && { kitOutOverride }) });

/** Moves a job by one of its allowed transitions; boards, lists and the job page refresh. */
export function useMoveJob() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: moveJob,
    onSettled: async () => {
      await queryClient.invalidateQueries({ queryKey: jobsRootKey });
      await queryClient.invalidateQueries({ queryKey: getNotificationsQueryOptions().queryKey });
    },
  });
}
