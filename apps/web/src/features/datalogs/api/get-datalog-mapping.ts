import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DatalogMapping } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { datalogsRootKey } from './get-datalog';

export const getDatalogMapping = (datalogId: string) =>
  api.get<ItemResponse<DatalogMapping>>(`/api/datalogs/${encodeURIComponent(datalogId)}/mapping`);

export const getDatalogMappingQueryOptions = (datalogId: string) =>
  queryOptions({ queryKey: [...datalogsRootKey, 'mapping', datalogId], queryFn: () => getDatalogMapping(datalogId) });

export const useDatalogMapping = (datalogId: string, options: { enabled?: boolean } = {}) =>
  useQuery({ ...getDatalogMappingQueryOptions(datalogId), enabled: options.enabled ?? true });
