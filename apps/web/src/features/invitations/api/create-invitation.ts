import { useMutation, useQueryClient } from '@tanstack/react-query';
import { z } from 'zod';
import { emailSchema, SHOP_ROLES } from '@revloop/domain/auth';
import { api, type ItemResponse } from '../../../lib/api-client';
import type { SentInvitation } from '@revloop/contract';
import { getInvitationsQueryOptions } from './get-invitations';

export const createInvitationSchema = z
  .object({
    email: emailSchema,
    role: z.enum(SHOP_ROLES, { message: 'Choose a role.' }),
    dealerId: z.string().optional(),
  })
  .refine((value) => value.role !== 'dealer' || Boolean(value.dealerId), {
    path: ['dealerId'],
    message: 'Choose the dealer this user works for.',
  })
  .transform((value) => ({ email: value.email, role: value.role, ...(value.role === 'dealer' ? { dealerId: value.dealerId } : {}) }));
export type CreateInvitationInput = z.output<typeof createInvitationSchema>;

/** Sends an invitation e-mail with a link to /invitations/:token. */
export const createInvitation = (input: CreateInvitationInput) => api.post<ItemResponse<SentInvitation>>('/api/invitations', input);

export function useCreateInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createInvitation,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getInvitationsQueryOptions().queryKey }),
  });
}
