import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Revenue } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';

export const getRevenue = () => api.get<ItemResponse<Revenue>>('/api/admin/revenue');

export const getRevenueQueryOptions = () => queryOptions({ queryKey: ['billing', 'revenue'], queryFn: getRevenue });

export const useRevenue = () => useQuery(getRevenueQueryOptions());
