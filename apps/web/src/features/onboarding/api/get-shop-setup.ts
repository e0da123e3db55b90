import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ShopSetup } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';

/** The first-run checklist (`GET /api/shop/setup`), each item derived from the shop's data. */
export const getShopSetup = () => api.get<ItemResponse<ShopSetup>>('/api/shop/setup');

export const getShopSetupQueryOptions = () =>
  // Always re-read on the board: the owner ticks items on other pages.
  queryOptions({ queryKey: ['shop', 'setup'], queryFn: getShopSetup, staleTime: 0 });

export const useShopSetup = (enabled: boolean) =>
  useQuery({ ...getShopSetupQueryOptions(), enabled });
