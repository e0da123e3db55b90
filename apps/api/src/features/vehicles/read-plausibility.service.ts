import { findVehicle, type CalibrationFileRow, type Db, type JobListRow, type ShopRow } from '@revloop/db';
import { readPlausibility, type ReadPlausibility } from '@revloop/domain/calibration';
import { expectedImageSizesFor, parseShopSettings } from '@revloop/domain/shops';
import type { VehicleInput } from '@revloop/domain/vehicles';

/**
 * Judges reads of one job against the image sizes the shop expects for the vehicle's engine family: a function
 * that answers null for revisions (only what came off the car is judged).
 */
export async function readPlausibilityForJob(
  db: Db,
  shop: Pick<ShopRow, 'id' | 'settings'>,
  job: Pick<JobListRow, 'vehicle_id'>,
): Promise<(row: Pick<CalibrationFileRow, 'kind' | 'image_bytes'>) => ReadPlausibility | null> {
  const vehicle = await findVehicle(db, shop.id, job.vehicle_id);
  // A spec stored before validation tightened may lack the engine; then nothing is expected and nothing flagged.
  const family = vehicle ? ((JSON.parse(vehicle.spec) as Partial<VehicleInput>).engine?.family ?? '') : '';
  const expected = expectedImageSizesFor(parseShopSettings(shop.settings), family);
  return (row) => (row.kind === 'revision' ? null : readPlausibility(row.image_bytes, expected));
}
