import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { getInvitationsQueryOptions } from './get-invitations';

/** Withdraws a pending invitation; its link stops working. */
export const revokeInvitation = (invitationId: string) => api.delete(`/api/invitations/${encodeURIComponent(invitationId)}`);

export function useRevokeInvitation() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: revokeInvitation,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getInvitationsQueryOptions().queryKey }),
  });
}
