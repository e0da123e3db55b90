import type { Insertable, Selectable } from 'kysely';

export interface NotificationTable {
  id: string;
  shop_id: string;
  user_id: string;
  job_id: string | null;
  kind: string;
  title: string;
  body: string;
  read_at: string | null;
  created_at: string;
}
export type NotificationRow = Selectable<NotificationTable>;
export type InsertableNotificationRow = Insertable<NotificationTable>;
