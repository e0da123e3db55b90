import { queryOptions, useQuery } from '@tanstack/react-query';
import type { JobDetail } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { jobsRootKey } from './get-jobs';

export const getJob = (jobId: string) => api.get<ItemResponse<JobDetail>>(`/api/jobs/${encodeURIComponent(jobId)}`);

export const getJobQueryOptions = (jobId: string) => queryOptions({ queryKey: [...jobsRootKey, 'detail', jobId], queryFn: () => getJob(jobId) });

export const useJob = (jobId: string) => useQuery(getJobQueryOptions(jobId));
