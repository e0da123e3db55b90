import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ShopRole } from '@revloop/domain/auth';
import { api, type ListResponse } from '../../../lib/api-client';

export interface Invitation {
  id: string;
  email: string;
  role: ShopRole;
  dealer: { id: string; name: string } | null;
  createdAt: string;
  expiresAt: string;
}

/** Pending invitations of the shop. */
export const getInvitations = () => api.get<ListResponse<Invitation>>('/api/invitations');

export const getInvitationsQueryOptions = () => queryOptions({ queryKey: ['invitations', 'pending'], queryFn: getInvitations });

export const useInvitations = (options: { enabled?: boolean } = {}) => useQuery({ ...getInvitationsQueryOptions(), ...options });
