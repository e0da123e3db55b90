import { queryOptions, useQuery } from '@tanstack/react-query';
import type { InvitationLookup } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';

/** What an invitation link offers, read before the invitee has an account. */
export const getInvitationByToken = (token: string) =>
  api.get<ItemResponse<InvitationLookup>>(`/api/invitations/lookup/${encodeURIComponent(token)}`);

export const getInvitationByTokenQueryOptions = (token: string) =>
  queryOptions({ queryKey: ['invitations', 'lookup', token], queryFn: () => getInvitationByToken(token) });

export const useInvitationByToken = (token: string) => useQuery(getInvitationByTokenQueryOptions(token));
