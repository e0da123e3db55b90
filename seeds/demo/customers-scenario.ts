import { findShopById, insertPayment, newId, updateShop, type Db } from '@revloop/db';
import { parseShopSettings } from '@revloop/domain/shops';
import type { SeededShop } from './seed-demo';

/**
 * Kestrel's customer-facing history: the image sizes it expects per engine family (invented for the demo; the
 * 1.5 turbo I3 list leaves out the 256 KiB the demo reads have, so that family's reads are flagged), and card
 * payments for its direct customers' jobs, so the customer list has money paid to sort by.
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

  const jobs = await db
    .selectFrom('jobs')
    .innerJoin('packages', 'packages.id', 'jobs.package_id')
    .select(['jobs.id', 'jobs.customer_user_id', 'jobs.created_at', 'packages.retail_price_minor'])
    .where('jobs.shop_id', '=', kestrel.shopId)
    .where('jobs.dealer_id', 'is', null)
    .where('jobs.state', '!=', 'cancelled')
    // The first customer's jobs stay unpaid: the payment walkthrough and its tests start from them.
    .where('jobs.customer_user_id', '!=', kestrel.customerIds[0]!)
    .orderBy('jobs.number')
    .execute();
  // Two in three direct jobs were paid by card when they were opened.
  for (const [i, job] of jobs.entries()) {
    if (i % 3 === 2) continue;
    const paidAt = new Date(new Date(job.created_at).getTime() + 20 * 60_000).toISOString();
    await insertPayment(db, {
      id: newId(),
      shop_id: kestrel.shopId,
      purpose: 'job',
      job_id: job.id,
      dealer_id: null,
      payer_user_id: job.customer_user_id,
      amount_minor: job.retail_price_minor,
      currency: shop.currency,
      status: 'paid',
      stripe_checkout_session_id: `cs_demo_${job.id}`,
      stripe_payment_intent_id: `pi_demo_${job.id}`,
      created_at: job.created_at,
      paid_at: paidAt,
    });
  }
}
