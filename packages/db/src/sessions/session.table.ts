import type { Selectable } from 'kysely';

/** Only the SHA-256 of the cookie secret is stored: a leaked table signs nobody in. Times are epoch ms. */
export interface SessionTable {
  id: string;
  user_id: string;
  shop_id: string | null;
  created_at: number;
  expires_at: number;
  absolute_expires_at: number;
}
export type SessionRow = Selectable<SessionTable>;
