import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ItemResponse } from '../../../lib/api-client';
import { jobsRootKey, type Job } from './get-jobs';

export interface TimelineEntry {
  id: string;
  at: string;
  action: string;
  actor: string | null;
  text: string;
}

export interface JobDetail extends Job {
  timeline: TimelineEntry[];
}

export const getJob = (jobId: string) => api.get<ItemResponse<JobDetail>>(`/api/jobs/${encodeURIComponent(jobId)}`);

export const getJobQueryOptions = (jobId: string) => queryOptions({ queryKey: [...jobsRootKey, 'detail', jobId], queryFn: () => getJob(jobId) });

export const useJob = (jobId: string) => useQuery(getJobQueryOptions(jobId));
