import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Datalog } from '@revloop/contract';
import { api, type ListResponse } from '../../../lib/api-client';
import { datalogsRootKey, processingPollMs } from './get-datalog';

export const getJobDatalogs = (jobId: string) => api.get<ListResponse<Datalog>>(`/api/jobs/${encodeURIComponent(jobId)}/datalogs`);

export const getJobDatalogsQueryOptions = (jobId: string) =>
  queryOptions({
    queryKey: [...datalogsRootKey, 'job', jobId],
    queryFn: () => getJobDatalogs(jobId),
    refetchInterval: (query) => processingPollMs(query.state.data?.data ?? []),
  });

export const useJobDatalogs = (jobId: string) => useQuery(getJobDatalogsQueryOptions(jobId));
