import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PlanId, ReadOnlyReason, SubscriptionStatus } from '@revloop/domain/billing';
import { api, type ItemResponse } from '../../../lib/api-client';

export interface PlanOffer {
  id: PlanId;
  name: string;
  seatPriceMinor: number;
  minSeats: number;
  maxSeats: number;
  jobsPerMonth: number;
  summary: string;
}

export interface SubscriptionInvoice {
  id: string;
  status: string;
  reason: string | null;
  amountDueMinor: number;
  amountPaidMinor: number;
  currency: string;
  periodStart: string | null;
  periodEnd: string | null;
  createdAt: string;
}

export interface Subscription {
  planId: PlanId;
  planName: string;
  seats: number;
  status: SubscriptionStatus;
  statusLabel: string;
  currency: string;
  monthlyAmountMinor: number;
  trialEndsAt: string | null;
  currentPeriodEnd: string | null;
  cancelAtPeriodEnd: boolean;
  pastDueSince: string | null;
  graceEndsAt: string | null;
  readOnlyReason: ReadOnlyReason | null;
  readOnlyText: string | null;
  /** A running subscription at the payment provider: plan changes apply to it directly. */
  managedByProvider: boolean;
  hasPaymentMethod: boolean;
  usage: { seatsInUse: number; jobsThisMonth: number; jobsPerMonth: number };
  invoices: SubscriptionInvoice[];
  plans: PlanOffer[];
}

export const getSubscription = () => api.get<ItemResponse<Subscription>>('/api/billing/subscription');

export const getSubscriptionQueryOptions = () => queryOptions({ queryKey: ['billing', 'subscription'], queryFn: getSubscription });

export const useSubscription = () => useQuery(getSubscriptionQueryOptions());
