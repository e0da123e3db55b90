import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DealerDetail } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { getDealersQueryOptions } from './get-dealers';

export const getDealer = (dealerId: string) => api.get<ItemResponse<DealerDetail>>(`/api/dealers/${encodeURIComponent(dealerId)}`);

/** Keyed under the dealers list, so invalidating the list refreshes every detail too. */
export const getDealerQueryOptions = (dealerId: string) =>
  queryOptions({ queryKey: [...getDealersQueryOptions().queryKey, dealerId], queryFn: () => getDealer(dealerId) });

export const useDealer = (dealerId: string) => useQuery(getDealerQueryOptions(dealerId));
