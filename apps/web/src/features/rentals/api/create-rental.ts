import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Rental, RentalCreate } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { invalidateRentals } from './invalidate-rentals';

/** Staff send a kitId and book at once (409 rental_clash when taken); customers and dealers ask without one. */
export const createRental = (input: RentalCreate) => api.post<ItemResponse<Rental>>('/api/rentals', input);

export function useCreateRental() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: createRental, onSettled: () => invalidateRentals(queryClient) });
}
