import type { Insertable, Selectable } from 'kysely';

export interface VehicleTable {
  id: string;
  shop_id: string;
  owner_user_id: string;
  dealer_id: string | null;
  vin: string;
  model_year: number;
  description: string;
  /** The whole validated vehicle input (domain `VehicleInput`) as JSON; vin, year and description are columns for search. */
  spec: string;
  /** Measured rolling circumference in mm (mirrors spec.rollingCircumferenceMm); null = computed from the tyre size. */
  rolling_circumference_mm: number | null;
  created_at: string;
  updated_at: string;
}
export type VehicleRow = Selectable<VehicleTable>;
export type InsertableVehicleRow = Insertable<VehicleTable>;
