import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Rental } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { invalidateRentals } from './invalidate-rentals';

export const agreeRentalTerms = (rentalId: string) => api.post<ItemResponse<Rental>>(`/api/rentals/${encodeURIComponent(rentalId)}/terms`, { accept: true });

export function useAgreeRentalTerms() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: agreeRentalTerms, onSettled: () => invalidateRentals(queryClient) });
}
