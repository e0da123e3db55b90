import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PublicVerifyResult } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';

/** `POST /api/public/shops/:slug/verify`: opens the account, signs it in and opens the job. */
export const verifyStart = (slug: string, token: string) =>
  api.post<ItemResponse<PublicVerifyResult>>(
    `/api/public/shops/${encodeURIComponent(slug)}/verify`,
    { token },
  );

export function useVerifyStart(slug: string) {
  const queryClient = useQueryClient();
  // The browser is signed in now: every cached answer from before (e.g. "not signed in") is stale.
  return useMutation({
    mutationFn: (token: string) => verifyStart(slug, token),
    onSuccess: () => queryClient.clear(),
  });
}
