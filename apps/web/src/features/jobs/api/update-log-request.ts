import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Job } from '@revloop/contract';
import type { LogRequest } from '@revloop/domain/datalog';
import { apiRequest, type ItemResponse } from '../../../lib/api-client';
import { jobsRootKey } from './get-jobs';

export const updateLogRequest = ({ jobId, logRequest }: { jobId: string; logRequest: LogRequest }) =>
  apiRequest<ItemResponse<Job>>('PUT', `/api/jobs/${encodeURIComponent(jobId)}/log-request`, logRequest);

export function useUpdateLogRequest() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: updateLogRequest, onSuccess: () => queryClient.invalidateQueries({ queryKey: jobsRootKey }) });
}
