import { SHOP_ROLES } from '@revloop/domain/auth';
import { z } from 'zod';
import { itemOf, listOf, timestamp } from './envelope';

/** A pending invitation as `GET /api/invitations` lists them. */
export const invitationSchema = z.object({
  id: z.string(),
  email: z.string(),
  role: z.enum(SHOP_ROLES),
  dealer: z.object({ id: z.string(), name: z.string().nullable() }).nullable(),
  createdAt: timestamp,
  expiresAt: timestamp,
});
export type Invitation = z.infer<typeof invitationSchema>;
export const invitationsResponseSchema = listOf(invitationSchema);

/** What `POST /api/invitations` answers about the invitation it sent. */
export const sentInvitationSchema = invitationSchema.pick({ id: true, email: true, role: true, expiresAt: true });
export type SentInvitation = z.infer<typeof sentInvitationSchema>;

/** `GET /api/invitations/lookup/:token`: what an invitation link offers, read before the invitee has an account. */
export const invitationLookupSchema = z.object({
  email: z.string(),
  role: z.enum(SHOP_ROLES),
  shopName: z.string(),
  dealerName: z.string().nullable(),
  expiresAt: timestamp,
  /** The address already has an account: accepting asks for its password instead of making one. */
  existingAccount: z.boolean(),
});
export type InvitationLookup = z.infer<typeof invitationLookupSchema>;
export const invitationLookupResponseSchema = itemOf(invitationLookupSchema);
