import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { TunerLoadReport } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { reportCsvHref, reportSearch, reportsRootKey, type ReportRange } from './report-range';

export const getTunerLoad = (range: ReportRange) => api.get<ItemResponse<TunerLoadReport>>(`/api/reports/tuner-load?${reportSearch(range)}`);

export const getTunerLoadQueryOptions = (range: ReportRange) =>
  queryOptions({ queryKey: [...reportsRootKey, 'tuner-load', range], queryFn: () => getTunerLoad(range), placeholderData: keepPreviousData });

export const useTunerLoad = (range: ReportRange) => useQuery(getTunerLoadQueryOptions(range));

export const getTunerLoadCsvHref = (range: ReportRange) => reportCsvHref('tuner-load', range);
