import type { Generated, Insertable, Selectable, Updateable } from 'kysely';

export interface PackageTable {
  id: string;
  shop_id: string;
  name: string;
  description: Generated<string>;
  /** JSON array of module names (ECM, TCM). */
  modules: string;
  retail_price_minor: number;
  dealer_price_minor: number;
  rounds_included: number;
  active: Generated<number>;
  created_at: string;
}
export type PackageRow = Selectable<PackageTable>;
export type InsertablePackageRow = Insertable<PackageTable>;
export type UpdateablePackageRow = Updateable<PackageTable>;
