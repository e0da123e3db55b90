import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, type ItemResponse } from '../../../lib/api-client';
import { getJobPaymentsQueryOptions, type JobPayment } from './get-job-payments';

export interface RefundRequest {
  paymentId: string;
  amountMinor: number;
  reason: string;
  /** The same id for retries of one refund, so a double submit refunds once. */
  requestId: string;
}

export const refundPayment = ({ paymentId, ...body }: RefundRequest) =>
  api.post<ItemResponse<JobPayment>>(`/api/billing/payments/${encodeURIComponent(paymentId)}/refunds`, body);

export function useRefundPayment(jobId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: refundPayment,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getJobPaymentsQueryOptions(jobId).queryKey }),
  });
}
