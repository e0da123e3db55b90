import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Job } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { jobsRootKey } from './get-jobs';

export const assignJob = ({ jobId, tunerId }: { jobId: string; tunerId: string | null }) =>
  api.post<ItemResponse<Job>>(`/api/jobs/${encodeURIComponent(jobId)}/assign`, { tunerId });

/** The owner gives a job to a tuner (or takes it back with null). */
export function useAssignJob() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: assignJob, onSettled: () => queryClient.invalidateQueries({ queryKey: jobsRootKey }) });
}
