import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Invitation } from '@revloop/contract';
import { api, type ListResponse } from '../../../lib/api-client';

/** Pending invitations of the shop. */
export const getInvitations = () => api.get<ListResponse<Invitation>>('/api/invitations');

export const getInvitationsQueryOptions = () => queryOptions({ queryKey: ['invitations', 'pending'], queryFn: getInvitations });

export const useInvitations = (options: { enabled?: boolean } = {}) => useQuery({ ...getInvitationsQueryOptions(), ...options });
