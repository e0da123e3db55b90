import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { JobMessage } from '@revloop/contract';
import type { MessageInput } from '@revloop/domain/jobs';
import { api, type ItemResponse } from '../../../lib/api-client';
import { getJobMessagesQueryOptions } from './get-job-messages';

export const createJobMessage = ({ jobId, ...input }: MessageInput & { jobId: string }) =>
  api.post<ItemResponse<JobMessage>>(`/api/jobs/${encodeURIComponent(jobId)}/messages`, input);

export function useCreateJobMessage(jobId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (input: MessageInput) => createJobMessage({ jobId, ...input }),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getJobMessagesQueryOptions(jobId).queryKey }),
  });
}
