import { insertVehicle, newId, updateVehicle, vehicleColumns } from '@revloop/db';
import type { VehicleInput } from '@revloop/domain/vehicles';
import type { AppDeps } from '../../context';
import type { AuthContext } from '../../http/auth-context';
import { writeWithAudit } from '../audit/audit.service';

/** Registers a vehicle for an owner the router has already authorized, and audits it; returns the new id. */
export async function createVehicle(
  { db, clock }: AppDeps,
  auth: AuthContext & { shop: { id: string } },
  owner: { userId: string; dealerId: string | null },
  vehicle: VehicleInput,
): Promise<string> {
  const at = clock.now().toISOString();
  const row = await writeWithAudit(
    db,
    (trx) =>
      insertVehicle(trx, {
        id: newId(),
        shop_id: auth.shop.id,
        owner_user_id: owner.userId,
        dealer_id: owner.dealerId,
        ...vehicleColumns(vehicle),
        created_at: at,
        updated_at: at,
      }),
    (inserted) => ({ shopId: auth.shop.id, actorUserId: auth.user.id, action: 'vehicle.created', subjectType: 'Vehicle', subjectId: inserted.id, at: clock.now() }),
  );
  return row.id;
}

/** Replaces a vehicle's details. */
export async function editVehicle({ db, clock }: AppDeps, shopId: string, vehicleId: string, vehicle: VehicleInput): Promise<void> {
  await updateVehicle(db, shopId, vehicleId, { ...vehicleColumns(vehicle), updated_at: clock.now().toISOString() });
}
