import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ListResponse } from '../../../lib/api-client';
import { datalogsRootKey, type Datalog } from './get-datalog';

export const getJobDatalogs = (jobId: string) => api.get<ListResponse<Datalog>>(`/api/jobs/${encodeURIComponent(jobId)}/datalogs`);

export const getJobDatalogsQueryOptions = (jobId: string) =>
  queryOptions({
    queryKey: [...datalogsRootKey, 'job', jobId],
    queryFn: () => getJobDatalogs(jobId),
    refetchInterval: (query) => (query.state.data?.data.some((log) => log.status === 'processing') ? 700 : false),
  });

export const useJobDatalogs = (jobId: string) => useQuery(getJobDatalogsQueryOptions(jobId));
