import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Rental, RentalTransition } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { invalidateRentals } from './invalidate-rentals';

export const moveRental = ({ rentalId, move }: { rentalId: string; move: RentalTransition }) =>
  api.post<ItemResponse<Rental>>(`/api/rentals/${encodeURIComponent(rentalId)}/transitions`, move);

export function useMoveRental() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: moveRental, onSettled: () => invalidateRentals(queryClient) });
}
