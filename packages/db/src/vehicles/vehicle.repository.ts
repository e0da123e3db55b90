import type { VehicleInput } from '@revloop/domain/vehicles';
import type { Db } from '../client';
import type { InsertableVehicleRow, VehicleRow } from './vehicle.table';

export type VehicleScope = { kind: 'shop' } | { kind: 'owner'; userId: string } | { kind: 'dealer'; dealerId: string };

export interface VehicleListRow extends VehicleRow {
  owner_name: string;
  owner_email: string;
}

function scoped(db: Db, shopId: string, scope: VehicleScope) {
  let query = db
    .selectFrom('vehicles')
    .innerJoin('users', 'users.id', 'vehicles.owner_user_id')
    .selectAll('vehicles')
    .select(['users.name as owner_name', 'users.email as owner_email'])
    .where('vehicles.shop_id', '=', shopId);
  if (scope.kind === 'owner') query = query.where('vehicles.owner_user_id', '=', scope.userId);
  if (scope.kind === 'dealer') query = query.where('vehicles.dealer_id', '=', scope.dealerId);
  return query;
}

/** The columns a validated vehicle fills: the spec as JSON and the fields kept beside it for search and reports. */
export type VehicleColumns = Pick<VehicleRow, 'vin' | 'model_year' | 'description' | 'spec' | 'rolling_circumference_mm'>;

export function vehicleColumns(vehicle: VehicleInput): VehicleColumns {
  return {
    vin: vehicle.vin,
    model_year: vehicle.modelYear,
    description: vehicle.description,
    spec: JSON.stringify(vehicle),
    rolling_circumference_mm: vehicle.rollingCircumferenceMm ?? null,
  };
}

export async function insertVehicle(db: Db, row: InsertableVehicleRow): Promise<VehicleRow> {
  return db.insertInto('vehicles').values(row).returningAll().executeTakeFirstOrThrow();
}

export async function findVehicle(db: Db, shopId: string, id: string): Promise<VehicleListRow | undefined> {
  return scoped(db, shopId, { kind: 'shop' }).where('vehicles.id', '=', id).executeTakeFirst();
}

export async function listVehicles(db: Db, shopId: string, scope: VehicleScope, ownerUserId?: string): Promise<VehicleListRow[]> {
  let query = scoped(db, shopId, scope);
  if (ownerUserId) query = query.where('vehicles.owner_user_id', '=', ownerUserId);
  return query.orderBy('vehicles.created_at', 'desc').execute();
}

export async function updateVehicle(
  db: Db,
  shopId: string,
  id: string,
  patch: VehicleColumns & Pick<VehicleRow, 'updated_at'>,
): Promise<VehicleRow | undefined> {
  return db.updateTable('vehicles').set(patch).where('shop_id', '=', shopId).where('id', '=', id).returningAll().executeTakeFirst();
}

/** The ids of the vehicle's jobs, oldest first (a vehicle has a handful). */
export async function listVehicleJobIds(db: Db, shopId: string, vehicleId: string): Promise<string[]> {
  const rows = await db.selectFrom('jobs').select('id').where('shop_id', '=', shopId).where('vehicle_id', '=', vehicleId).orderBy('number').execute();
  return rows.map((r) => r.id);
}
