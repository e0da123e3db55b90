import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Member } from '@revloop/contract';
import type { ShopRole } from '@revloop/domain/auth';
import { api, type ItemResponse } from '../../../lib/api-client';
import { getMembersQueryOptions } from './get-members';

export const updateMemberRole = ({ memberId, role }: { memberId: string; role: ShopRole }) =>
  api.patch<ItemResponse<Member>>(`/api/members/${encodeURIComponent(memberId)}`, { role });

export function useUpdateMemberRole() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateMemberRole,
    onSettled: () => queryClient.invalidateQueries({ queryKey: getMembersQueryOptions().queryKey }),
  });
}
