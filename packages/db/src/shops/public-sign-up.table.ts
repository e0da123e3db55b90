import type { Insertable, Selectable } from 'kysely';

/** A sign-up from a shop's public page, waiting for its e-mailed link; nothing lands in the shop before that. */
export interface PublicSignUpTable {
  /** SHA-256 of the link's token: the token itself is only in the e-mail. */
  token_hash: string;
  shop_id: string;
  email: string;
  name: string;
  password_hash: string;
  /** JSON of the intake (vehicle, package, goals, requests) the job opens with. */
  intake: string;
  created_at: string;
  expires_at: string;
  used_at: string | null;
}
export type PublicSignUpRow = Selectable<PublicSignUpTable>;
export type InsertablePublicSignUpRow = Insertable<PublicSignUpTable>;
