import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, type ItemResponse } from '../../../lib/api-client';
import type { PlatformShop } from '@revloop/contract';
import { getShopsQueryOptions } from './get-shops';

export const reactivateShop = (shopId: string) => api.post<ItemResponse<PlatformShop>>(`/api/admin/shops/${encodeURIComponent(shopId)}/reactivate`);

export function useReactivateShop() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: reactivateShop,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getShopsQueryOptions().queryKey }),
  });
}
