import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { JobPayment } from '@revloop/contract';
import type { RefundInput } from '@revloop/domain/billing';
import { api, type ItemResponse } from '../../../lib/api-client';
import { getJobPaymentsQueryOptions } from './get-job-payments';

/** The domain's refund input (its `requestId` makes a double submit refund once) and the payment it refunds. */
export type RefundRequest = RefundInput & { paymentId: string };

export const refundPayment = ({ paymentId, ...body }: RefundRequest) =>
  api.post<ItemResponse<JobPayment>>(`/api/billing/payments/${encodeURIComponent(paymentId)}/refunds`, body);

export function useRefundPayment(jobId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: refundPayment,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getJobPaymentsQueryOptions(jobId).queryKey }),
  });
}
