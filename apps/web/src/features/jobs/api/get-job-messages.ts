import { queryOptions, useQuery } from '@tanstack/react-query';
import type { JobMessage } from '@revloop/contract';
import { api, type ListResponse } from '../../../lib/api-client';
import { jobsRootKey } from './get-jobs';

export const getJobMessages = (jobId: string) => api.get<ListResponse<JobMessage>>(`/api/jobs/${encodeURIComponent(jobId)}/messages`);

export const getJobMessagesQueryOptions = (jobId: string) =>
  queryOptions({ queryKey: [...jobsRootKey, 'messages', jobId], queryFn: () => getJobMessages(jobId) });

export const useJobMessages = (jobId: string) => useQuery(getJobMessagesQueryOptions(jobId));
