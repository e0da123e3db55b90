import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Member } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { getMembersQueryOptions } from './get-members';

export const reactivateMember = (memberId: string) => api.post<ItemResponse<Member>>(`/api/members/${encodeURIComponent(memberId)}/reactivate`);

export function useReactivateMember() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: reactivateMember,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getMembersQueryOptions().queryKey }),
  });
}
