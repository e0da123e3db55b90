import { queryOptions, useQuery } from '@tanstack/react-query';
import type { LedgerKind } from '@revloop/domain/billing';
import { api, type ItemResponse } from '../../../lib/api-client';

export interface LedgerEntry {
  id: string;
  seq: number;
  kind: LedgerKind;
  kindLabel: string;
  amountMinor: number;
  balanceAfterMinor: number;
  jobId: string | null;
  jobNumber: number | null;
  memo: string;
  createdAt: string;
}

export interface DealerLedger {
  dealer: { id: string; name: string };
  currency: string;
  balanceMinor: number;
  canTopUp: boolean;
  entries: LedgerEntry[];
}

export const dealerLedgerCsvHref = (dealerId: string) => `/api/dealers/${encodeURIComponent(dealerId)}/ledger?format=csv`;

export const getDealerLedger = (dealerId: string) => api.get<ItemResponse<DealerLedger>>(`/api/dealers/${encodeURIComponent(dealerId)}/ledger`);

export const getDealerLedgerQueryOptions = (dealerId: string) =>
  queryOptions({ queryKey: ['billing', 'ledger', dealerId], queryFn: () => getDealerLedger(dealerId) });

export const useDealerLedger = (dealerId: string) => useQuery(getDealerLedgerQueryOptions(dealerId));
