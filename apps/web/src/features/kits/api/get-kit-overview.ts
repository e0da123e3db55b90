import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DayRange, KitOverview } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { kitsRootKey } from './get-kits';

export const getKitOverview = (range: DayRange) => api.get<ItemResponse<KitOverview>>(`/api/kits/overview?${new URLSearchParams({ from: range.from, to: range.to })}`);

export const getKitOverviewQueryOptions = (range: DayRange) => queryOptions({ queryKey: [...kitsRootKey, 'overview', range], queryFn: () => getKitOverview(range) });

export const useKitOverview = (range: DayRange, options: { enabled?: boolean } = {}) => useQuery({ ...getKitOverviewQueryOptions(range), ...options });
