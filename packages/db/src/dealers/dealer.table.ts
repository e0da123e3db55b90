import type { Insertable, Selectable } from 'kysely';

export interface DealerTable {
  id: string;
  shop_id: string;
  name: string;
  contact_name: string;
  contact_email: string;
  phone: string | null;
  created_at: string;
}
export type DealerRow = Selectable<DealerTable>;
export type InsertableDealerRow = Insertable<DealerTable>;
