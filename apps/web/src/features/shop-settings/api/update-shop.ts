import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ShopFrontDoorPatch, ShopPaymentLockPatch, ShopRevisionReviewPatch } from '@revloop/contract';
import type { ShopSettings } from '@revloop/domain/shops';
import { api, type ItemResponse } from '../../../lib/api-client';
import type { Shop } from '@revloop/contract';
import { getShopQueryOptions } from './get-shop';

export interface ShopPatch extends ShopFrontDoorPatch, ShopRevisionReviewPatch, ShopPaymentLockPatch {
  name?: string;
  settings?: Partial<ShopSettings>;
}

export const updateShop = (patch: ShopPatch) => api.patch<ItemResponse<Shop>>('/api/shop', patch);

export function useUpdateShop() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateShop,
    onSuccess: (response) => {
      queryClient.setQueryData(getShopQueryOptions().queryKey, response);
      // The first-run checklist reads the same settings.
      void queryClient.invalidateQueries({
        queryKey: [...getShopQueryOptions().queryKey, 'setup'],
      });
    },
  });
}
