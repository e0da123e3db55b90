import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ListResponse } from '../../../lib/api-client';

export interface DealerBalance {
  id: string;
  name: string;
  balanceMinor: number;
  currency: string;
}

export const getDealerBalances = () => api.get<ListResponse<DealerBalance>>('/api/billing/dealer-balances');

export const getDealerBalancesQueryOptions = () => queryOptions({ queryKey: ['billing', 'dealer-balances'], queryFn: getDealerBalances });

export const useDealerBalances = () => useQuery(getDealerBalancesQueryOptions());
