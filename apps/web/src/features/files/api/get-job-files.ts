import { queryOptions, useQuery } from '@tanstack/react-query';
import type { JobFilesResponse } from '@revloop/contract';
import { api } from '../../../lib/api-client';

/** Every files query sits under this key, so one invalidation refreshes lists, checks and diffs. */
export const filesRootKey = ['files'] as const;

export const getJobFiles = (jobId: string) => api.get<JobFilesResponse>(`/api/jobs/${encodeURIComponent(jobId)}/files`);

export const getJobFilesQueryOptions = (jobId: string) =>
  queryOptions({ queryKey: [...filesRootKey, 'job', jobId], queryFn: () => getJobFiles(jobId) });

export const useJobFiles = (jobId: string) => useQuery(getJobFilesQueryOptions(jobId));
