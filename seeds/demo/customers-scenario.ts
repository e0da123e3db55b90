import { findShopById, updateShop, type Db } from '@revloop/db';
import { parseShopSettings } from '@revloop/domain/shops';
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
