import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PublicShop } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';

/** A shop's public page (`GET /api/public/shops/:slug`): no sign-in needed. */
export const getPublicShop = (slug: string) =>
  api.get<ItemResponse<PublicShop>>(`/api/public/shops/${encodeURIComponent(slug)}`);

export const getPublicShopQueryOptions = (slug: string) =>
  queryOptions({ queryKey: ['public-shop', slug], queryFn: () => getPublicShop(slug) });

export const usePublicShop = (slug: string) => useQuery(getPublicShopQueryOptions(slug));
