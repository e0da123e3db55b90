import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Me } from '@revloop/contract';
import { UNIT_SYSTEMS } from '@revloop/contract';
import { z } from 'zod';
import { api } from '../../../lib/api-client';
import { getMeQueryOptions } from './get-me';

export const updateMeSchema = z.object({
  name: z.string().trim().min(1, 'Enter your name.').max(80, 'Use at most 80 characters.'),
  unitSystem: z.enum(UNIT_SYSTEMS),
});
export type UpdateMeInput = z.output<typeof updateMeSchema>;

export const updateMe = (input: UpdateMeInput) => api.patch<Me>('/api/me', input);

export function useUpdateMe() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateMe,
    onSuccess: (me) => queryClient.setQueryData(getMeQueryOptions().queryKey, me),
  });
}
