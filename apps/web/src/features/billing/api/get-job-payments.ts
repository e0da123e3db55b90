import { queryOptions, useQuery } from '@tanstack/react-query';
import type { JobPayments } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';

export const getJobPayments = (jobId: string) => api.get<ItemResponse<JobPayments>>(`/api/billing/jobs/${encodeURIComponent(jobId)}/payments`);

export const getJobPaymentsQueryOptions = (jobId: string) =>
  queryOptions({ queryKey: ['billing', 'job-payments', jobId], queryFn: () => getJobPayments(jobId) });

export const useJobPayments = (jobId: string) => useQuery(getJobPaymentsQueryOptions(jobId));
