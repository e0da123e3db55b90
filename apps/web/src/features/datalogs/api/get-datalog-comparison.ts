import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DatalogComparison } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { datalogsRootKey } from './get-datalog';

export const getDatalogComparison = (baseId: string, otherId: string) =>
  api.get<ItemResponse<DatalogComparison>>(`/api/datalogs/${encodeURIComponent(baseId)}/compare/${encodeURIComponent(otherId)}`);

export const getDatalogComparisonQueryOptions = (baseId: string, otherId: string) =>
  queryOptions({ queryKey: [...datalogsRootKey, 'compare', baseId, otherId], queryFn: () => getDatalogComparison(baseId, otherId) });

export const useDatalogComparison = (baseId: string, otherId: string | null) =>
  useQuery({ ...getDatalogComparisonQueryOptions(baseId, otherId ?? ''), enabled: otherId !== null });
