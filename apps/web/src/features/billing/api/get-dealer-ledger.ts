import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DealerLedger } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';

export const dealerLedgerCsvHref = (dealerId: string) => `/api/dealers/${encodeURIComponent(dealerId)}/ledger?format=csv`;

export const getDealerLedger = (dealerId: string) => api.get<ItemResponse<DealerLedger>>(`/api/dealers/${encodeURIComponent(dealerId)}/ledger`);

export const getDealerLedgerQueryOptions = (dealerId: string) =>
  queryOptions({ queryKey: ['billing', 'ledger', dealerId], queryFn: () => getDealerLedger(dealerId) });

export const useDealerLedger = (dealerId: string) => useQuery(getDealerLedgerQueryOptions(dealerId));
