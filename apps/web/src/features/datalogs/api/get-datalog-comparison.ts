import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CheckId, CheckStatus, Range } from '@revloop/domain/datalog';
import { api, type ItemResponse } from '../../../lib/api-client';
import { datalogsRootKey } from './get-datalog';

export interface ComparedLog {
  id: string;
  round: number;
  originalName: string;
  createdAt: string;
}

export interface DatalogComparison {
  base: ComparedLog;
  other: ComparedLog;
  checks: { id: CheckId; base: CheckStatus | null; other: CheckStatus | null }[];
  /** Cells present in either log; a side without enough samples there is null. */
  fuelTrim: { rpm: Range; map: Range; baseTrimPct: number | null; otherTrimPct: number | null; deltaPct: number | null }[];
  /** Full-throttle lambda error per rpm bin, all pulls of a log pooled by samples. */
  lambdaError: { rpm: Range; baseErrorPct: number | null; otherErrorPct: number | null; deltaPct: number | null }[];
}

export const getDatalogComparison = (baseId: string, otherId: string) =>
  api.get<ItemResponse<DatalogComparison>>(`/api/datalogs/${encodeURIComponent(baseId)}/compare/${encodeURIComponent(otherId)}`);

export const getDatalogComparisonQueryOptions = (baseId: string, otherId: string) =>
  queryOptions({ queryKey: [...datalogsRootKey, 'compare', baseId, otherId], queryFn: () => getDatalogComparison(baseId, otherId) });

export const useDatalogComparison = (baseId: string, otherId: string | null) =>
  useQuery({ ...getDatalogComparisonQueryOptions(baseId, otherId ?? ''), enabled: otherId !== null });
