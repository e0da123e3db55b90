import type { Generated, Insertable, Selectable, Updateable } from 'kysely';

export type ShopStatus = 'active' | 'suspended';

export interface ShopTable {
  id: string;
  name: string;
  status: Generated<ShopStatus>;
  currency: Generated<string>;
  /** JSON object of shop settings; parsed by the API with its zod schema. */
  settings: Generated<string>;
  created_at: string;
  suspended_at: string | null;
}
export type ShopRow = Selectable<ShopTable>;
export type InsertableShopRow = Insertable<ShopTable>;
export type UpdateableShopRow = Updateable<ShopTable>;
