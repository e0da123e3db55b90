import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { TurnaroundReport } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { reportCsvHref, reportSearch, reportsRootKey, type ReportRange } from './report-range';

export const getTurnaround = (range: ReportRange) => api.get<ItemResponse<TurnaroundReport>>(`/api/reports/turnaround?${reportSearch(range)}`);

export const getTurnaroundQueryOptions = (range: ReportRange) =>
  queryOptions({ queryKey: [...reportsRootKey, 'turnaround', range], queryFn: () => getTurnaround(range), placeholderData: keepPreviousData });

export const useTurnaround = (range: ReportRange) => useQuery(getTurnaroundQueryOptions(range));

export const getTurnaroundCsvHref = (range: ReportRange) => reportCsvHref('turnaround', range);
