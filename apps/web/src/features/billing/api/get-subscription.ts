import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Subscription } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';

export const getSubscription = () => api.get<ItemResponse<Subscription>>('/api/billing/subscription');

export const getSubscriptionQueryOptions = () => queryOptions({ queryKey: ['billing', 'subscription'], queryFn: getSubscription });

export const useSubscription = () => useQuery(getSubscriptionQueryOptions());
