import { useMutation } from '@tanstack/react-query';
import type { CheckoutInput } from '@revloop/domain/billing';
import { api } from '../../../lib/api-client';

/** Asks the server for a hosted Checkout page; the price always comes from the server. */
export const startCheckout = (input: CheckoutInput) => api.post<{ url: string }>('/api/billing/checkout', input);

/** Starts Checkout and sends the browser to the payment page; the webhook, not the return, records the payment. */
export function useStartCheckout() {
  return useMutation({
    mutationFn: startCheckout,
    onSuccess: ({ url }) => {
      window.location.assign(url);
    },
  });
}
