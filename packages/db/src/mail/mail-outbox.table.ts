import type { Insertable, Selectable } from 'kysely';

export interface MailOutboxTable {
  id: string;
  /** One address, or a JSON array of them when the text starts with '['. */
  to_address: string;
  subject: string;
  text: string;
  html: string | null;
  attempts: number;
  last_error: string | null;
  /** Set while one drain sends it, so two drains (or two API instances) never send it twice. */
  claimed_at: string | null;
  created_at: string;
}
export type MailOutboxRow = Selectable<MailOutboxTable>;
export type InsertableMailOutboxRow = Insertable<MailOutboxTable>;
