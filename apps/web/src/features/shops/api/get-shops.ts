import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ListResponse } from '../../../lib/api-client';

export interface Shop {
  id: string;
  name: string;
  status: 'active' | 'suspended';
  createdAt: string;
  owner: { name: string; email: string } | null;
  memberCount: number;
}

export const getShops = () => api.get<ListResponse<Shop>>('/api/admin/shops');

export const getShopsQueryOptions = () => queryOptions({ queryKey: ['admin', 'shops'], queryFn: getShops });

export const useShops = () => useQuery(getShopsQueryOptions());
