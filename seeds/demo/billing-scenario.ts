import { appendLedgerEntry, insertAuditEvent, insertPayment, insertPaymentRefund, insertShopSubscription, insertSubscriptionChange, newId, type Db } from '@revloop/db';
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

  for (const shop of [shops.kestrel, shops.harbor]) {
    await seedRetailPayments(db, shop, jobs);
    await seedPaymentLockWaivers(db, shop, jobs);
  }

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

/**
 * Retail customers paid their finished jobs a few hours after opening them, and the customer who cancelled after a
 * revision got half back, so the reports' revenue has months of history. Jobs at work (on the bench, with the
 * customer, in log review) were paid the same way, so their customers download their revisions: both shops keep a
 * sent revision locked until paid (the default). The first customer's jobs (customer@kestrel.test,
 * customer@harbor.test) stay unpaid: their sent revisions are the demo's revisions locked until paid, and the
 * walkthrough and the tests pay those by hand. Jobs waiting at intake, ready or on hold are not paid yet.
 */
async function seedRetailPayments(db: Db, shop: SeededShop, jobs: SeededJob[]): Promise<void> {
  const rows = await db
    .selectFrom('jobs')
    .innerJoin('packages', 'packages.id', 'jobs.package_id')
    .innerJoin('shops', 'shops.id', 'jobs.shop_id')
    .select(['jobs.id', 'jobs.state', 'jobs.round', 'jobs.customer_user_id', 'jobs.created_at', 'jobs.state_changed_at', 'packages.retail_price_minor', 'shops.currency'])
    .where('jobs.shop_id', '=', shop.shopId)
    .where('jobs.dealer_id', 'is', null)
    .where('jobs.id', 'in', jobs.map((j) => j.id).concat(''))
    .where('jobs.customer_user_id', '!=', shop.customerIds[0] ?? '')
    .orderBy('jobs.created_at')
    .execute();
  for (const job of rows) {
    const refund = job.state === 'cancelled' && job.round > 0;
    const atWork = job.state === 'on_bench' || job.state === 'with_customer' || job.state === 'log_review';
    if (job.state !== 'dialed_in' && !refund && !atWork) continue;
    const paidAt = new Date(Date.parse(job.created_at) + 3 * 3_600_000).toISOString();
    const payment = await insertPayment(db, {
      id: newId(),
      shop_id: shop.shopId,
      purpose: 'job',
      job_id: job.id,
      dealer_id: null,
      payer_user_id: job.customer_user_id,
      amount_minor: job.retail_price_minor,
      currency: job.currency,
      status: 'paid',
      stripe_checkout_session_id: `cs_demo_${job.id}`,
      stripe_payment_intent_id: `pi_demo_${job.id}`,
      created_at: job.created_at,
      paid_at: paidAt,
    });
    if (refund) {
      await insertPaymentRefund(db, {
        id: newId(),
        shop_id: shop.shopId,
        payment_id: payment.id,
        amount_minor: Math.round(job.retail_price_minor / 2),
        currency: job.currency,
        reason: 'Cancelled after the first revision: half refunded',
        stripe_refund_id: `re_demo_${job.id}`,
        by_user_id: shop.ownerId,
        created_at: job.state_changed_at,
      });
    }
  }
}

/**
 * The first customer is a regular the owner trusts: on the jobs where they downloaded revisions before paying, the
 * owner waived payment before download when the job opened (on the job's timeline, as the waive button records it).
 * Their job still with the customer and never downloaded keeps its revision locked until paid.
 */
async function seedPaymentLockWaivers(db: Db, shop: SeededShop, jobs: SeededJob[]): Promise<void> {
  const rows = await db
    .selectFrom('jobs')
    .select(['jobs.id', 'jobs.created_at'])
    .where('jobs.shop_id', '=', shop.shopId)
    .where('jobs.dealer_id', 'is', null)
    .where('jobs.customer_user_id', '=', shop.customerIds[0] ?? '')
    .where('jobs.id', 'in', jobs.map((j) => j.id).concat(''))
    .where((eb) => eb.exists(eb.selectFrom('audit_events').select('audit_events.id').whereRef('audit_events.subject_id', '=', 'jobs.id').where('audit_events.action', '=', 'file.downloaded')))
    .execute();
  for (const job of rows) {
    const at = new Date(Date.parse(job.created_at) + 1_800_000).toISOString();
    await db.updateTable('jobs').set({ payment_lock_waived_at: at, payment_lock_waived_by_user_id: shop.ownerId }).where('shop_id', '=', shop.shopId).where('id', '=', job.id).execute();
    await insertAuditEvent(db, {
      id: newId(),
      shop_id: shop.shopId,
      actor_user_id: shop.ownerId,
      action: 'payment.lock_waived',
      subject_type: 'Job',
      subject_id: job.id,
      details: JSON.stringify({ text: 'Payment before download waived: the customer may download the revisions before paying' }),
      created_at: at,
    });
  }
}
