import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Me } from '@revloop/contract';
import { acceptInvitationSchema } from '@revloop/domain/auth';
import type { z } from 'zod';
import { api } from '../../../lib/api-client';
import { replaceSession } from './get-me';

export { acceptInvitationSchema };
export type AcceptInvitationInput = z.output<typeof acceptInvitationSchema> & { token: string };

/** Creates the invitee's account (or joins an existing one) and signs them in. */
export const acceptInvitation = (input: AcceptInvitationInput) => api.post<Me>('/api/invitations/accept', input);

export function useAcceptInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: acceptInvitation,
    onSuccess: (me) => replaceSession(queryClient, me),
  });
}
