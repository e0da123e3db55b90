import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { CanonicalChannel, KnockEvent } from '@revloop/domain/datalog';
import { api, type ItemResponse } from '../../../lib/api-client';
import { datalogsRootKey } from './get-datalog';

export interface SeriesChannel {
  channel: CanonicalChannel;
  label: string;
  unit: string;
  /** Seconds from the start of the log, and the values at those times (at most `points` of them). */
  t: number[];
  v: number[];
}

export interface DatalogSeries {
  from: number;
  to: number;
  durationS: number;
  available: CanonicalChannel[];
  channels: SeriesChannel[];
  knock: KnockEvent[];
}

/** `lttb` keeps each channel's shape on its own; `rows` gives every channel the same time stamps (scatter plots). */
export type SeriesSampling = 'lttb' | 'rows';

export interface SeriesRequest {
  channels: readonly string[];
  from?: number | undefined;
  to?: number | undefined;
  points?: number;
  sampling?: SeriesSampling;
}

export const getDatalogSeries = (datalogId: string, request: SeriesRequest) => {
  const query = new URLSearchParams({ channels: request.channels.join(','), points: String(request.points ?? 2000) });
  if (request.from !== undefined) query.set('from', String(request.from));
  if (request.to !== undefined) query.set('to', String(request.to));
  if (request.sampling === 'rows') query.set('sampling', 'rows');
  return api.get<ItemResponse<DatalogSeries>>(`/api/datalogs/${encodeURIComponent(datalogId)}/series?${query}`);
};

export const getDatalogSeriesQueryOptions = (datalogId: string, request: SeriesRequest) =>
  queryOptions({
    queryKey: [...datalogsRootKey, 'series', datalogId, request],
    queryFn: () => getDatalogSeries(datalogId, request),
    placeholderData: keepPreviousData,
    staleTime: Infinity,
  });

export const useDatalogSeries = (datalogId: string | null, request: SeriesRequest) =>
  useQuery({ ...getDatalogSeriesQueryOptions(datalogId ?? '', request), enabled: datalogId !== null && request.channels.length > 0 });
