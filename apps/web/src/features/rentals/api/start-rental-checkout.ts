import { useMutation } from '@tanstack/react-query';
import type { RentalCheckout } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';

/** `fee`: Checkout in payment mode for the rental fee; `deposit`: Checkout in setup mode saving the card the hold goes on. */
export type RentalCheckoutKind = 'fee' | 'deposit';

export const startRentalCheckout = ({ rentalId, kind }: { rentalId: string; kind: RentalCheckoutKind }) =>
  api.post<ItemResponse<RentalCheckout>>(`/api/rentals/${encodeURIComponent(rentalId)}/${kind}/checkout`);

/** Sends the browser to the payment stand-in's hosted page; the webhook, not the return, records the payment. */
export function useStartRentalCheckout() {
  return useMutation({
    mutationFn: startRentalCheckout,
    onSuccess: ({ data }) => {
      window.location.assign(data.url);
    },
  });
}
