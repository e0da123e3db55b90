import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PlatformShopListItem } from '@revloop/contract';
import { api, type ListResponse } from '../../../lib/api-client';

export const getShops = () => api.get<ListResponse<PlatformShopListItem>>('/api/admin/shops');

export const getShopsQueryOptions = () => queryOptions({ queryKey: ['admin', 'shops'], queryFn: getShops });

export const useShops = () => useQuery(getShopsQueryOptions());
