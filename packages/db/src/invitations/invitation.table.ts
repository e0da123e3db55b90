import type { Insertable, Selectable } from 'kysely';
import type { ShopRole } from '@revloop/domain/auth';

export interface InvitationTable {
  id: string;
  shop_id: string;
  email: string;
  role: ShopRole;
  dealer_id: string | null;
  token_hash: string;
  invited_by_user_id: string | null;
  created_at: string;
  expires_at: string;
  accepted_at: string | null;
  revoked_at: string | null;
}
export type InvitationRow = Selectable<InvitationTable>;
export type InsertableInvitationRow = Insertable<InvitationTable>;
