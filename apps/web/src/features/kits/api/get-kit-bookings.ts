import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DayRange, KitCalendar } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { kitsRootKey } from './get-kits';

export const getKitBookings = (kitId: string, range: DayRange) =>
  api.get<ItemResponse<KitCalendar>>(`/api/kits/${encodeURIComponent(kitId)}/bookings?${new URLSearchParams({ from: range.from, to: range.to })}`);

export const getKitBookingsQueryOptions = (kitId: string, range: DayRange) =>
  queryOptions({ queryKey: [...kitsRootKey, 'bookings', kitId, range], queryFn: () => getKitBookings(kitId, range) });

export const useKitBookings = (kitId: string | undefined, range: DayRange) =>
  useQuery({ ...getKitBookingsQueryOptions(kitId ?? '', range), enabled: Boolean(kitId) });
