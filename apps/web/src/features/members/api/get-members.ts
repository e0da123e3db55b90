import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ShopRole } from '@revloop/domain/auth';
import { api, type ListResponse } from '../../../lib/api-client';

export interface Member {
  id: string;
  userId: string;
  name: string;
  email: string;
  role: ShopRole;
  status: 'active' | 'deactivated';
  dealer: { id: string; name: string } | null;
  createdAt: string;
  lastSignInAt: string | null;
}

export const getMembers = () => api.get<ListResponse<Member>>('/api/members');

export const getMembersQueryOptions = () => queryOptions({ queryKey: ['members'], queryFn: getMembers });

export const useMembers = () => useQuery(getMembersQueryOptions());
