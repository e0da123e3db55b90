import { findShopById, updateShop, type Db } from '@revloop/db';
import { defaultLogRequest, type LogRequest } from '@revloop/domain/datalog';
import { parseShopSettings } from '@revloop/domain/shops';
import type { VehicleInput } from '@revloop/domain/vehicles';
import type { SeededShop } from './seed-demo';

/**
 * The image sizes Kestrel expects per engine family (invented for the demo): the 1.5 turbo I3 list leaves out the
 * 256 KiB the demo reads have, so that family's reads are flagged. Card payments come from the billing scenario.
 */
export async function seedCustomers(db: Db, kestrel: SeededShop): Promise<void> {
  const shop = (await findShopById(db, kestrel.shopId))!;
  const KiB = 1024;
  const settings = {
    ...parseShopSettings(shop.settings),
    imageSizes: {
      '2.0 turbo I4': [256 * KiB, 128 * KiB],
      V8: [256 * KiB, 128 * KiB, 512 * KiB],
      '3.0 turbo I6': [256 * KiB, 128 * KiB],
      '1.5 turbo I3': [512 * KiB, 128 * KiB],
    },
  };
  await updateShop(db, kestrel.shopId, { settings: JSON.stringify(settings) });
}

/**
 * An established shop has its log-request defaults set (the first-run checklist's second step): one per engine family
 * the shop has worked on, starting from the built-in request for a first log, so the checklist does not nag the demo
 * owners and new jobs ask for what the demo's jobs asked for.
 */
export async function seedLogRequestDefaults(db: Db, seeded: SeededShop): Promise<void> {
  const shop = (await findShopById(db, seeded.shopId))!;
  const specs = await db.selectFrom('vehicles').select('spec').where('shop_id', '=', seeded.shopId).execute();
  const families = [...new Set(specs.map((v) => (JSON.parse(v.spec) as VehicleInput).engine.family))].sort();
  const logRequestDefaults: Record<string, LogRequest> = Object.fromEntries(families.map((family) => [family, defaultLogRequest(family, 1)]));
  const settings = { ...parseShopSettings(shop.settings), logRequestDefaults };
  await updateShop(db, seeded.shopId, { settings: JSON.stringify(settings) });
}
