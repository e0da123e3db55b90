import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Job } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { jobsRootKey } from './get-jobs';

export const takeJob = (jobId: string) => api.post<ItemResponse<Job>>(`/api/jobs/${encodeURIComponent(jobId)}/take`);

/** A tuner takes an unassigned job. */
export function useTakeJob() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: takeJob, onSettled: () => queryClient.invalidateQueries({ queryKey: jobsRootKey }) });
}
