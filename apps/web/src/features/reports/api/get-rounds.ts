import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { RoundsReport } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { reportCsvHref, reportSearch, reportsRootKey, type ReportRange } from './report-range';

export const getRounds = (range: ReportRange) => api.get<ItemResponse<RoundsReport>>(`/api/reports/rounds?${reportSearch(range)}`);

export const getRoundsQueryOptions = (range: ReportRange) =>
  queryOptions({ queryKey: [...reportsRootKey, 'rounds', range], queryFn: () => getRounds(range), placeholderData: keepPreviousData });

export const useRounds = (range: ReportRange) => useQuery(getRoundsQueryOptions(range));

export const getRoundsCsvHref = (range: ReportRange) => reportCsvHref('rounds', range);
