import { queryOptions, useQuery } from '@tanstack/react-query';
import type { AfrScale, CanonicalChannel, DatalogMappingInput } from '@revloop/domain/datalog';
import { api, type ItemResponse } from '../../../lib/api-client';
import { datalogsRootKey } from './get-datalog';

export interface DatalogMapping {
  /** The log's column headers, in order. */
  headers: string[];
  /** Canonical channel → the header feeding it now (absent = not logged). */
  channels: Partial<Record<CanonicalChannel, string>>;
  /** Canonical channel → the unit its column is read in now (stated or from the header); null = the channel's own unit. */
  units: Partial<Record<CanonicalChannel, string | null>>;
  /** Channel → unit the user stated. */
  stated: Partial<Record<CanonicalChannel, string>>;
  /** Scale of the AFR columns as stated; null = the fuel's, checked against cruise. */
  afrScale: AfrScale | null;
  trimAxis: DatalogMappingInput['trimAxis'] | null;
  /** Headers no channel takes now. */
  unmapped: string[];
  /** The channels a log can hold, with plain names and the units a user may state, in display order. */
  canonical: { channel: CanonicalChannel; label: string; unit: string; unitChoices: { value: string; label: string }[] }[];
  /** Whether this shop has a confirmed mapping for this header set. */
  remembered: boolean;
}

export const getDatalogMapping = (datalogId: string) =>
  api.get<ItemResponse<DatalogMapping>>(`/api/datalogs/${encodeURIComponent(datalogId)}/mapping`);

export const getDatalogMappingQueryOptions = (datalogId: string) =>
  queryOptions({ queryKey: [...datalogsRootKey, 'mapping', datalogId], queryFn: () => getDatalogMapping(datalogId) });

export const useDatalogMapping = (datalogId: string, options: { enabled?: boolean } = {}) =>
  useQuery({ ...getDatalogMappingQueryOptions(datalogId), enabled: options.enabled ?? true });
