import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { JobListResponse, JobSortKey } from '@revloop/contract';
import type { JobState } from '@revloop/domain/jobs';
import { api } from '../../../lib/api-client';

/** The list filters the server understands; absent means "any". */
export interface JobListParams {
  state?: JobState[];
  open?: boolean;
  tuner?: string;
  dealer?: string;
  package?: string;
  customer?: string;
  q?: string;
  mine?: boolean;
  /** Only jobs with a revision draft waiting for approval (staff). */
  awaitingApproval?: boolean;
  sort?: JobSortKey;
  dir?: 'asc' | 'desc';
  page?: number;
  pageSize?: number;
}

/** The query string for the list and the CSV export: only the filters that are set, in a stable order. */
export function jobListSearch(params: JobListParams): string {
  const search = new URLSearchParams();
  if (params.state?.length) search.set('state', params.state.join(','));
  if (params.open) search.set('open', 'true');
  if (params.mine) search.set('mine', 'true');
  else if (params.tuner) search.set('tuner', params.tuner);
  if (params.dealer) search.set('dealer', params.dealer);
  if (params.package) search.set('package', params.package);
  if (params.customer) search.set('customer', params.customer);
  if (params.q?.trim()) search.set('q', params.q.trim());
  if (params.awaitingApproval) search.set('awaiting', 'approval');
  if (params.sort) search.set('sort', params.sort);
  if (params.dir) search.set('dir', params.dir);
  if (params.page && params.page > 1) search.set('page', String(params.page));
  if (params.pageSize) search.set('pageSize', String(params.pageSize));
  return search.toString();
}

export const getJobs = (params: JobListParams) => api.get<JobListResponse>(`/api/jobs?${jobListSearch(params)}`);

/** Every job query (lists, details, threads) sits under this key, so one invalidation refreshes them all. */
export const jobsRootKey = ['jobs'] as const;

export const getJobsQueryOptions = (params: JobListParams = {}) =>
  queryOptions({ queryKey: [...jobsRootKey, 'list', params], queryFn: () => getJobs(params), placeholderData: keepPreviousData });

export const useJobs = (params: JobListParams, options: { enabled?: boolean } = {}) => useQuery({ ...getJobsQueryOptions(params), ...options });
