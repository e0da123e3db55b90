import { queryOptions, useQuery } from '@tanstack/react-query';
import type { RentalListQuery, RentalSummary } from '@revloop/contract';
import { api, type ListResponse } from '../../../lib/api-client';

/** The rental list's filters, as the API's query schema takes them. */
export type RentalListParams = RentalListQuery;

export const getRentals = (params: RentalListParams) => {
  const search = new URLSearchParams(Object.entries(params).filter((entry): entry is [string, string] => Boolean(entry[1])));
  return api.get<ListResponse<RentalSummary>>(`/api/rentals?${search}`);
};

/** Every rental query sits under this key, so a move refreshes lists and details at once. */
export const rentalsRootKey = ['rentals'] as const;

export const getRentalsQueryOptions = (params: RentalListParams) => queryOptions({ queryKey: [...rentalsRootKey, 'list', params], queryFn: () => getRentals(params) });

export const useRentals = (params: RentalListParams) => useQuery(getRentalsQueryOptions(params));
