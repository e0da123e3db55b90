import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Rental } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { rentalsRootKey } from './get-rentals';

export const getRental = (rentalId: string) => api.get<ItemResponse<Rental>>(`/api/rentals/${encodeURIComponent(rentalId)}`);

export const getRentalQueryOptions = (rentalId: string) => queryOptions({ queryKey: [...rentalsRootKey, 'detail', rentalId], queryFn: () => getRental(rentalId) });

export const useRental = (rentalId: string) => useQuery(getRentalQueryOptions(rentalId));
