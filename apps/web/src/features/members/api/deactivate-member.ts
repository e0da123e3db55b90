import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Member } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { getMembersQueryOptions } from './get-members';

/** A deactivated member can no longer sign in; their jobs and files stay. */
export const deactivateMember = (memberId: string) => api.post<ItemResponse<Member>>(`/api/members/${encodeURIComponent(memberId)}/deactivate`);

export function useDeactivateMember() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: deactivateMember,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getMembersQueryOptions().queryKey }),
  });
}
