import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DealerBalance } from '@revloop/contract';
import { api, type ListResponse } from '../../../lib/api-client';

export const getDealerBalances = () => api.get<ListResponse<DealerBalance>>('/api/billing/dealer-balances');

export const getDealerBalancesQueryOptions = () => queryOptions({ queryKey: ['billing', 'dealer-balances'], queryFn: getDealerBalances });

export const useDealerBalances = () => useQuery(getDealerBalancesQueryOptions());
