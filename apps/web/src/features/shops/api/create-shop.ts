import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { emailSchema } from '@revloop/domain/auth';
import { api, type ItemResponse } from '../../../lib/api-client';
import type { PlatformShop } from '@revloop/contract';
import { getShopsQueryOptions } from './get-shops';

export const createShopSchema = z.object({
  name: z.string().trim().min(2, 'Enter a shop name of at least 2 characters.').max(80, 'Use at most 80 characters.'),
  ownerName: z.string().trim().min(1, "Enter the owner's name.").max(80, 'Use at most 80 characters.'),
  ownerEmail: emailSchema,
});
export type CreateShopInput = z.output<typeof createShopSchema>;

/** Creates the shop and e-mails its owner an invitation. */
export const createShop = (input: CreateShopInput) => api.post<ItemResponse<PlatformShop>>('/api/admin/shops', input);

export function useCreateShop() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createShop,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getShopsQueryOptions().queryKey }),
  });
}
