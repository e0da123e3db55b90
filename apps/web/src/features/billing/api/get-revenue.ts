import { queryOptions, useQuery } from '@tanstack/react-query';
import type { MrrPoint, PlanId, ReadOnlyReason, SubscriptionStatus } from '@revloop/domain/billing';
import { api, type ItemResponse } from '../../../lib/api-client';

export interface ShopRevenue {
  shopId: string;
  shopName: string;
  shopStatus: 'active' | 'suspended';
  planId: PlanId;
  planName: string;
  seats: number;
  status: SubscriptionStatus;
  statusLabel: string;
  mrrMinor: number;
  trialEndsAt: string | null;
  currentPeriodEnd: string | null;
  readOnlyReason: ReadOnlyReason | null;
  readOnlyText: string | null;
}

export interface Revenue {
  currency: string;
  mrrMinor: number;
  shops: ShopRevenue[];
  series: MrrPoint[];
}

export const getRevenue = () => api.get<ItemResponse<Revenue>>('/api/admin/revenue');

export const getRevenueQueryOptions = () => queryOptions({ queryKey: ['billing', 'revenue'], queryFn: getRevenue });

export const useRevenue = () => useQuery(getRevenueQueryOptions());
