import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { WeeklyJobsReport } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { reportCsvHref, reportSearch, reportsRootKey, type ReportRange } from './report-range';

export const getWeeklyJobs = (range: ReportRange) => api.get<ItemResponse<WeeklyJobsReport>>(`/api/reports/weekly-jobs?${reportSearch(range)}`);

export const getWeeklyJobsQueryOptions = (range: ReportRange) =>
  queryOptions({ queryKey: [...reportsRootKey, 'weekly-jobs', range], queryFn: () => getWeeklyJobs(range), placeholderData: keepPreviousData });

export const useWeeklyJobs = (range: ReportRange) => useQuery(getWeeklyJobsQueryOptions(range));

export const getWeeklyJobsCsvHref = (range: ReportRange) => reportCsvHref('weekly-jobs', range);
