import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { emailSchema } from '@revloop/domain/auth';
import type { Dealer } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { getDealersQueryOptions } from './get-dealers';

export const createDealerSchema = z.object({
  name: z.string().trim().min(2, 'Enter a dealer name of at least 2 characters.').max(80, 'Use at most 80 characters.'),
  contactName: z.string().trim().min(1, 'Enter a contact name.').max(80, 'Use at most 80 characters.'),
  contactEmail: emailSchema,
  phone: z
    .string()
    .trim()
    .max(40, 'Use at most 40 characters.')
    .regex(/^[+\d\s().-]*$/, 'Use digits, spaces and + ( ) - only.')
    .transform((value) => value || undefined),
});
export type CreateDealerInput = z.output<typeof createDealerSchema>;

export const createDealer = (input: CreateDealerInput) => api.post<ItemResponse<Dealer>>('/api/dealers', input);

export function useCreateDealer() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createDealer,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getDealersQueryOptions().queryKey }),
  });
}
