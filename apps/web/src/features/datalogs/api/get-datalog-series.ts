import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { DatalogSeries, SeriesSampling } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { datalogsRootKey } from './get-datalog';

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
