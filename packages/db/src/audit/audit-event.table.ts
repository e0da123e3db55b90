import type { Generated, Insertable, Selectable } from 'kysely';

export interface AuditEventTable {
  id: string;
  shop_id: string | null;
  actor_user_id: string | null;
  action: string;
  subject_type: string;
  subject_id: string | null;
  details: Generated<string>;
  created_at: string;
}
export type AuditEventRow = Selectable<AuditEventTable>;
export type InsertableAuditEventRow = Insertable<AuditEventTable>;
