import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Shop } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';

export const getShop = () => api.get<ItemResponse<Shop>>('/api/shop');

export const getShopQueryOptions = () => queryOptions({ queryKey: ['shop'], queryFn: getShop });

export const useShop = () => useQuery(getShopQueryOptions());
