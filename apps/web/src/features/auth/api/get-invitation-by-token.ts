import { queryOptions, useQuery } from '@tanstack/react-query';
import type { ShopRole } from '@revloop/domain/auth';
import { api, type ItemResponse } from '../../../lib/api-client';

export interface InvitationLookup {
  email: string;
  role: ShopRole;
  shopName: string;
  dealerName: string | null;
  expiresAt: string;
}

/** What an invitation link offers, read before the invitee has an account. */
export const getInvitationByToken = (token: string) =>
  api.get<ItemResponse<InvitationLookup>>(`/api/invitations/lookup/${encodeURIComponent(token)}`);

export const getInvitationByTokenQueryOptions = (token: string) =>
  queryOptions({ queryKey: ['invitations', 'lookup', token], queryFn: () => getInvitationByToken(token) });

export const useInvitationByToken = (token: string) => useQuery(getInvitationByTokenQueryOptions(token));
