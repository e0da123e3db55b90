import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, type ItemResponse } from '../../../lib/api-client';
import type { PlatformShop } from '@revloop/contract';
import { getShopsQueryOptions } from './get-shops';

/** A suspended shop turns read-only for its members until it is reactivated. */
export const suspendShop = (shopId: string) => api.post<ItemResponse<PlatformShop>>(`/api/admin/shops/${encodeURIComponent(shopId)}/suspend`);

export function useSuspendShop() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: suspendShop,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getShopsQueryOptions().queryKey }),
  });
}
