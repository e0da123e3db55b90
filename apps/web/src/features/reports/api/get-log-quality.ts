import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { LogQualityReport } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { reportCsvHref, reportSearch, reportsRootKey, type ReportRange } from './report-range';

export const getLogQuality = (range: ReportRange) => api.get<ItemResponse<LogQualityReport>>(`/api/reports/log-quality?${reportSearch(range)}`);

export const getLogQualityQueryOptions = (range: ReportRange) =>
  queryOptions({ queryKey: [...reportsRootKey, 'log-quality', range], queryFn: () => getLogQuality(range), placeholderData: keepPreviousData });

export const useLogQuality = (range: ReportRange) => useQuery(getLogQualityQueryOptions(range));

export const getLogQualityCsvHref = (range: ReportRange) => reportCsvHref('log-quality', range);
