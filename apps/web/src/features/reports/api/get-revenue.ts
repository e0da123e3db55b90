import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { RevenueReport } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { reportCsvHref, reportSearch, reportsRootKey, type ReportRange } from './report-range';

export type RevenueGrouping = RevenueReport['by'];

export const getShopRevenue = (range: ReportRange, by: RevenueGrouping) => api.get<ItemResponse<RevenueReport>>(`/api/reports/revenue?${reportSearch(range, { by })}`);

export const getShopRevenueQueryOptions = (range: ReportRange, by: RevenueGrouping) =>
  queryOptions({ queryKey: [...reportsRootKey, 'revenue', by, range], queryFn: () => getShopRevenue(range, by), placeholderData: keepPreviousData });

export const useShopRevenue = (range: ReportRange, by: RevenueGrouping) => useQuery(getShopRevenueQueryOptions(range, by));

export const getShopRevenueCsvHref = (range: ReportRange, by: RevenueGrouping) => reportCsvHref('revenue', range, { by });
