import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ShopFrontDoor, ShopRevisionReview } from '@revloop/contract';
import type { ShopSettings } from '@revloop/domain/shops';
import { api, type ItemResponse } from '../../../lib/api-client';

export interface Shop extends ShopFrontDoor, ShopRevisionReview {
  id: string;
  name: string;
  currency: string;
  status: 'active' | 'suspended';
  readOnly: boolean;
  settings: ShopSettings;
}

export const getShop = () => api.get<ItemResponse<Shop>>('/api/shop');

export const getShopQueryOptions = () => queryOptions({ queryKey: ['shop'], queryFn: getShop });

export const useShop = () => useQuery(getShopQueryOptions());
