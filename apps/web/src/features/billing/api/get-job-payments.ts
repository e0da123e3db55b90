import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ItemResponse } from '../../../lib/api-client';

export interface JobRefund {
  id: string;
  amountMinor: number;
  reason: string;
  createdAt: string;
}

export interface JobPayment {
  id: string;
  amountMinor: number;
  currency: string;
  status: 'open' | 'paid' | 'expired';
  payerName: string;
  createdAt: string;
  paidAt: string | null;
  refundedMinor: number;
  refunds: JobRefund[];
}

export interface JobPayments {
  jobId: string;
  currency: string;
  /** Retail price of the job's package. */
  priceMinor: number;
  paidMinor: number;
  refundedMinor: number;
  dueMinor: number;
  /** A dealer's customer: the dealer paid wholesale from their balance; the amount only for those who may read that ledger. */
  paidByDealer: { dealerName: string; amountMinor: number | null } | null;
  payments: JobPayment[];
  canPay: boolean;
  canRefund: boolean;
}

export const getJobPayments = (jobId: string) => api.get<ItemResponse<JobPayments>>(`/api/billing/jobs/${encodeURIComponent(jobId)}/payments`);

export const getJobPaymentsQueryOptions = (jobId: string) =>
  queryOptions({ queryKey: ['billing', 'job-payments', jobId], queryFn: () => getJobPayments(jobId) });

export const useJobPayments = (jobId: string) => useQuery(getJobPaymentsQueryOptions(jobId));
