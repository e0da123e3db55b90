import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CanonicalChannel } from '@revloop/domain/datalog';
import { api, type ItemResponse } from '../../../lib/api-client';
import { datalogsRootKey } from './get-datalog';

export interface DatalogMapping {
  /** The log's column headers, in order. */
  headers: string[];
  /** Canonical channel → the header feeding it now (absent = not logged). */
  channels: Partial<Record<CanonicalChannel, string>>;
  /** The channels a log can hold, with plain names, in display order. */
  canonical: { channel: CanonicalChannel; label: string; unit: string }[];
  /** Whether this shop has a confirmed mapping for this header set. */
  remembered: boolean;
}

export const getDatalogMapping = (datalogId: string) =>
  api.get<ItemResponse<DatalogMapping>>(`/api/datalogs/${encodeURIComponent(datalogId)}/mapping`);

export const getDatalogMappingQueryOptions = (datalogId: string) =>
  queryOptions({ queryKey: [...datalogsRootKey, 'mapping', datalogId], queryFn: () => getDatalogMapping(datalogId) });

export const useDatalogMapping = (datalogId: string, options: { enabled?: boolean } = {}) =>
  useQuery({ ...getDatalogMappingQueryOptions(datalogId), enabled: options.enabled ?? true });
