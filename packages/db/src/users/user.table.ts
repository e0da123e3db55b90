import type { Generated, Insertable, Selectable, Updateable } from 'kysely';
import type { ShopRole } from '@revloop/domain/auth';

export interface UserTable {
  id: string;
  email: string;
  name: string;
  password_hash: string | null;
  platform_admin: Generated<number>;
  unit_system: Generated<'metric' | 'imperial'>;
  notification_prefs: Generated<string>;
  created_at: string;
  last_sign_in_at: string | null;
}
export type UserRow = Selectable<UserTable>;
export type InsertableUserRow = Insertable<UserTable>;
export type UpdateableUserRow = Updateable<UserTable>;

export interface MembershipTable {
  id: string;
  shop_id: string;
  user_id: string;
  role: ShopRole;
  dealer_id: string | null;
  status: Generated<'active' | 'deactivated'>;
  created_at: string;
}
export type MembershipRow = Selectable<MembershipTable>;
export type InsertableMembershipRow = Insertable<MembershipTable>;

export interface PasswordResetTable {
  token_hash: string;
  user_id: string;
  created_at: string;
  expires_at: string;
  used_at: string | null;
}
