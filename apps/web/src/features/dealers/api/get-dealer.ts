import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ItemResponse } from '../../../lib/api-client';
import { getDealersQueryOptions, type Dealer } from './get-dealers';

export interface DealerUser {
  id: string;
  name: string;
  email: string;
  status: 'active' | 'deactivated';
}

export interface DealerDetail extends Dealer {
  users: DealerUser[];
  /** Null for viewers who may not read the dealer's ledger (tuners). */
  balance: { balanceMinor: number; currency: string } | null;
  jobs: { open: number; total: number };
}

export const getDealer = (dealerId: string) => api.get<ItemResponse<DealerDetail>>(`/api/dealers/${encodeURIComponent(dealerId)}`);

/** Keyed under the dealers list, so invalidating the list refreshes every detail too. */
export const getDealerQueryOptions = (dealerId: string) =>
  queryOptions({ queryKey: [...getDealersQueryOptions().queryKey, dealerId], queryFn: () => getDealer(dealerId) });

export const useDealer = (dealerId: string) => useQuery(getDealerQueryOptions(dealerId));
