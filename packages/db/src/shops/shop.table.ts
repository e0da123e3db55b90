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
  /** The public page's address `/s/<slug>`; unique across shops, null until the owner sets one. */
  slug: string | null;
  description: Generated<string>;
  /** 1 when the public page is on. */
  public_page: Generated<number>;
  /** 1 when a revision draft needs another person's approval before it is sent (migration 013). */
  revision_approval: Generated<number>;
  /** 1 (the default) when a retail customer's sent revisions stay locked until the job is paid (migration 014). */
  paid_before_download: Generated<number>;
}
export type ShopRow = Selectable<ShopTable>;
export type InsertableShopRow = Insertable<ShopTable>;
export type UpdateableShopRow = Updateable<ShopTable>;
