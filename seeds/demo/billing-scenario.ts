import { appendLedgerEntry, insertShopSubscription, insertSubscriptionChange, newId, type Db } from '@revloop/db';
import { mrrMinorOf, type PlanId, type SubscriptionStatus } from '@revloop/domain/billing';
import type { SeededJob } from './jobs-scenario';
import type { SeededShop } from './seed-demo';

const DAY_MS = 86_400_000;

interface Step {
  daysAgo: number;
  planId: PlanId;
  seats: number;
  status: SubscriptionStatus;
}

/**
 * The invented billing history: both demo shops moved from their trial to a paid plan long ago (with no card on
 * file at the local payment stand-in, which forgets everything on restart), so the revenue chart has a past, and the
 * Ridgeline dealer has a prepaid balance that its seeded jobs were paid from.
 */
export async function seedBilling(db: Db, now: Date, shops: { kestrel: SeededShop; harbor: SeededShop }, jobs: SeededJob[]): Promise<void> {
  const iso = (daysAgo: number) => new Date(now.getTime() - daysAgo * DAY_MS).toISOString();

  const history = async (shopId: string, steps: Step[]) => {
    for (const step of steps) {
      await insertSubscriptionChange(db, { id: newId(), shop_id: shopId, plan_id: step.planId, seats: step.seats, status: step.status, mrr_minor: mrrMinorOf(step), at: iso(step.daysAgo) });
    }
    const last = steps.at(-1)!;
    await insertShopSubscription(db, {
      shop_id: shopId,
      plan_id: last.planId,
      seats: last.seats,
      status: last.status,
      trial_ends_at: null,
      current_period_end: null,
      past_due_since: null,
      read_only_reason: null,
      stripe_customer_id: null,
      stripe_subscription_id: null,
      provider_clock: null,
      created_at: iso(steps[0]!.daysAgo),
      updated_at: iso(last.daysAgo),
    });
  };
  await history(shops.kestrel.shopId, [
    { daysAgo: 320, planId: 'workshop', seats: 2, status: 'trialing' },
    { daysAgo: 306, planId: 'solo', seats: 1, status: 'active' },
    { daysAgo: 300, planId: 'workshop', seats: 2, status: 'active' },
    { daysAgo: 210, planId: 'workshop', seats: 3, status: 'active' },
    { daysAgo: 45, planId: 'workshop', seats: 5, status: 'active' },
  ]);
  await history(shops.harbor.shopId, [
    { daysAgo: 180, planId: 'workshop', seats: 2, status: 'trialing' },
    { daysAgo: 166, planId: 'workshop', seats: 2, status: 'active' },
  ]);

  const { dealerId, shopId } = shops.kestrel;
  if (!dealerId) return;
  const currency = (await db.selectFrom('shops').select('currency').where('id', '=', shopId).executeTakeFirstOrThrow()).currency;
  const dealerJobs = await db
    .selectFrom('jobs')
    .innerJoin('packages', 'packages.id', 'jobs.package_id')
    .select(['jobs.id', 'jobs.created_at', 'packages.name', 'packages.dealer_price_minor'])
    .where('jobs.shop_id', '=', shopId)
    .where('jobs.dealer_id', '=', dealerId)
    .where('jobs.id', 'in', jobs.filter((j) => j.dealerId === dealerId).map((j) => j.id).concat(''))
    .orderBy('jobs.created_at')
    .execute();
  // A top-up of 2,000.00 whenever a debit would leave less than 1,000.00, so the balance always covers one more job.
  let balance = 0;
  for (const job of dealerJobs) {
    if (balance - job.dealer_price_minor < 100000) {
      const at = new Date(Date.parse(job.created_at) - 3_600_000).toISOString();
      await appendLedgerEntry(db, { shopId, dealerId, kind: 'top_up', amountMinor: 200000, currency, memo: 'Top-up by bank transfer', at });
      balance += 200000;
    }
    await appendLedgerEntry(db, { shopId, dealerId, kind: 'job_debit', amountMinor: -job.dealer_price_minor, currency, jobId: job.id, memo: `${job.name} (wholesale)`, at: job.created_at });
    balance -= job.dealer_price_minor;
  }
}
