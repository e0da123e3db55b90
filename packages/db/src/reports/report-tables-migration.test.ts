import { describe, expect, it } from 'vitest';
import { newId } from '../ids';
import * as reportTables from '../migrations/2026-12-03-015-report-tables';
import { insertPackage } from '../packages/package.repository';
import { insertJob } from '../jobs/job.repository';
import { testEngine } from '../testing/postgres';
import { twoShops } from '../testing/two-shops';
import { insertVehicle } from '../vehicles/vehicle.repository';

// Migration 015 fills job_stints and customer_summaries from what came before it: the audit events of job moves and
// the payment rows. Run down and up again on rows written past the writers, the tables come back as the writers keep them.

const HOUR = 3_600_000;
const iso = (t: number) => new Date(t).toISOString();

// On PostgreSQL the test role may not create tables (migrations run as the migrating role), so this runs on SQLite.
describe.skipIf(testEngine() === 'postgres')('migration 015 backfill', () => {
  it('derives each move’s stint from the audit events and each customer’s money from payments and refunds', async () => {
    const { db, shopA, ownerA } = await twoShops();
    const t0 = Date.parse('2026-09-01T08:00:00Z');
    const vehicle = await insertVehicle(db, { id: newId(), shop_id: shopA, owner_user_id: ownerA, vin: '1M8GDM9AXKP042788', model_year: 1989, description: 'Test coupe', spec: '{}', created_at: iso(t0), updated_at: iso(t0) });
    const pkg = await insertPackage(db, { id: newId(), shop_id: shopA, name: 'Stage', modules: '["ECM"]', retail_price_minor: 50000, dealer_price_minor: 40000, rounds_included: 3, created_at: iso(t0) });
    const job = await insertJob(db, { id: newId(), shop_id: shopA, number: 1001, vehicle_id: vehicle.id, customer_user_id: ownerA, package_id: pkg.id, state: 'on_bench', goals: 'More power', log_request: '{}', cautions_accepted_at: iso(t0), state_changed_at: iso(t0 + 9 * HOUR), created_at: iso(t0), updated_at: iso(t0 + 9 * HOUR) });
    const event = (action: string, at: number, details: object = {}) => ({ id: newId(), shop_id: shopA, actor_user_id: ownerA, action, subject_type: 'Job', subject_id: job.id, details: JSON.stringify(details), created_at: iso(at) });
    const moves = [event('job.moved', t0 + 3 * HOUR, { from: 'intake', to: 'ready', round: 0 }), event('job.moved', t0 + 9 * HOUR, { from: 'ready', to: 'on_bench', round: 0 })];
    // An event between moves that is not a move must not start a stint.
    await db.insertInto('audit_events').values([event('job.opened', t0), moves[0]!, event('job.assigned', t0 + 5 * HOUR), moves[1]!]).execute();
    const payment = (amount: number, status: 'paid' | 'open') => ({ id: newId(), shop_id: shopA, purpose: 'job' as const, job_id: job.id, payer_user_id: ownerA, amount_minor: amount, currency: 'usd', status, stripe_checkout_session_id: `cs_${newId()}`, created_at: iso(t0), paid_at: status === 'paid' ? iso(t0 + HOUR) : null });
    const [paid, open, second] = [payment(50000, 'paid'), payment(7000, 'open'), payment(12000, 'paid')];
    await db.insertInto('payments').values([paid, open, second]).execute();
    await db.insertInto('payment_refunds').values({ id: newId(), shop_id: shopA, payment_id: paid.id, amount_minor: 15000, currency: 'usd', reason: 'test', stripe_refund_id: `re_${newId()}`, by_user_id: ownerA, created_at: iso(t0 + 2 * HOUR) }).execute();

    await reportTables.down(db);
    await reportTables.up(db);

    const stints = await db.selectFrom('job_stints').selectAll().orderBy('left_at').execute();
    expect(stints).toEqual([
      { id: moves[0]!.id, shop_id: shopA, job_id: job.id, state: 'intake', entered_at: iso(t0), left_at: iso(t0 + 3 * HOUR), hours: expect.closeTo(3, 6), to_state: 'ready', round: 0, left_by_user_id: ownerA },
      { id: moves[1]!.id, shop_id: shopA, job_id: job.id, state: 'ready', entered_at: iso(t0 + 3 * HOUR), left_at: iso(t0 + 9 * HOUR), hours: expect.closeTo(6, 6), to_state: 'on_bench', round: 0, left_by_user_id: ownerA },
    ]);
    // Paid 500.00 and 120.00 (the open checkout is not money), 150.00 refunded.
    expect(await db.selectFrom('customer_summaries').select(['shop_id', 'customer_user_id', 'paid_minor', 'refunded_minor']).execute()).toEqual([
      { shop_id: shopA, customer_user_id: ownerA, paid_minor: 62000, refunded_minor: 15000 },
    ]);
    // Deriving the stints again adds nothing: each takes its move's event id.
    await reportTables.backfillJobStints(db);
    expect(await db.selectFrom('job_stints').select('id').execute()).toHaveLength(2);
  });
});
