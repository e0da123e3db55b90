import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { JobPayments } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { jobsRootKey } from '../../jobs/api/get-jobs';
import { getJobPaymentsQueryOptions } from './get-job-payments';

/** The owner lets this job's customer download its revisions before paying (recorded on the job's timeline). */
export const waivePaymentLock = (jobId: string) => api.post<ItemResponse<JobPayments>>(`/api/billing/jobs/${encodeURIComponent(jobId)}/payment-lock/waive`, {});

export function useWaivePaymentLock(jobId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => waivePaymentLock(jobId),
    onSuccess: (response) => {
      queryClient.setQueryData(getJobPaymentsQueryOptions(jobId).queryKey, response);
      // The timeline gains the waiver.
      void queryClient.invalidateQueries({ queryKey: jobsRootKey });
    },
  });
}
