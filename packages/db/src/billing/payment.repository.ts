import { sql } from 'kysely';
import type { Db } from '../client';
import { inTransaction } from '../transaction';
import type { InsertablePaymentRefundRow, InsertablePaymentRow, PaymentRefundRow, PaymentRow } from './billing.table';

/**
 * The customer's money summary (Customers list "money paid") moves with each payment that lands and each refund, in
 * the writer's transaction: these three functions are its only writers. A payment not for a job changes nothing.
 */
async function addToCustomerSummary(db: Db, shopId: string, paymentId: string, change: { paidMinor: number; refundedMinor: number }, at: string): Promise<void> {
  await sql`insert into customer_summaries (shop_id, customer_user_id, paid_minor, refunded_minor, updated_at)
    select p.shop_id, j.customer_user_id, ${change.paidMinor}, ${change.refundedMinor}, ${at}
    from payments p join jobs j on j.id = p.job_id and j.shop_id = p.shop_id
    where p.shop_id = ${shopId} and p.id = ${paymentId}
    on conflict (shop_id, customer_user_id) do update set
      paid_minor = customer_summaries.paid_minor + excluded.paid_minor,
      refunded_minor = customer_summaries.refunded_minor + excluded.refunded_minor, updated_at = excluded.updated_at`.execute(db);
}

/** A payment row; one written already paid (as an import or a test fixture does) counts toward its customer's summary. */
export async function insertPayment(db: Db, row: InsertablePaymentRow): Promise<PaymentRow> {
  return inTransaction(db, async (trx) => {
    const inserted = await trx.insertInto('payments').values(row).returningAll().executeTakeFirstOrThrow();
    if (inserted.status === 'paid' && inserted.job_id) {
      await addToCustomerSummary(trx, inserted.shop_id, inserted.id, { paidMinor: inserted.amount_minor, refundedMinor: 0 }, inserted.paid_at ?? inserted.created_at);
    }
    return inserted;
  });
}

/**
 * Sums the shop's customer summaries again from its payments and refunds. Only for bulk loaders that write payment
 * rows in batches without the writers above (the benchmark's invented history); the app never needs it.
 */
export async function refreshCustomerSummaries(db: Db, shopId: string, at: string): Promise<void> {
  await inTransaction(db, async (trx) => {
    await trx.deleteFrom('customer_summaries').where('shop_id', '=', shopId).execute();
    await sql`insert into customer_summaries (shop_id, customer_user_id, paid_minor, refunded_minor, updated_at)
      select p.shop_id, j.customer_user_id, sum(p.amount_minor),
        coalesce(sum((select sum(r.amount_minor) from payment_refunds r where r.shop_id = p.shop_id and r.payment_id = p.id)), 0), ${at}
      from payments p join jobs j on j.id = p.job_id and j.shop_id = p.shop_id
      where p.shop_id = ${shopId} and p.status = 'paid'
      group by p.shop_id, j.customer_user_id`.execute(trx);
  });
}

export async function findPayment(db: Db, shopId: string, id: string): Promise<PaymentRow | undefined> {
  return db.selectFrom('payments').selectAll().where('shop_id', '=', shopId).where('id', '=', id).executeTakeFirst();
}

/** Webhooks name the Checkout Session only: this maps it back to its payment (platform-level, no session). */
export async function findPaymentByCheckoutSession(db: Db, sessionId: string): Promise<PaymentRow | undefined> {
  return db.selectFrom('payments').selectAll().where('stripe_checkout_session_id', '=', sessionId).executeTakeFirst();
}

/**
 * Marks an open payment paid and adds it to its customer's summary; false when it was already paid, so its effect is
 * applied once. Call it inside the transaction that applies the payment.
 */
export async function markPaymentPaid(db: Db, shopId: string, id: string, paymentIntentId: string | null, at: string): Promise<boolean> {
  const result = await db
    .updateTable('payments')
    .set({ status: 'paid', stripe_payment_intent_id: paymentIntentId, paid_at: at })
    .where('shop_id', '=', shopId)
    .where('id', '=', id)
    .where('status', '!=', 'paid')
    .executeTakeFirst();
  if (Number(result.numUpdatedRows) !== 1) return false;
  const { amount_minor } = await db.selectFrom('payments').select('amount_minor').where('shop_id', '=', shopId).where('id', '=', id).executeTakeFirstOrThrow();
  await addToCustomerSummary(db, shopId, id, { paidMinor: amount_minor, refundedMinor: 0 }, at);
  return true;
}

export async function markPaymentExpired(db: Db, shopId: string, id: string): Promise<void> {
  await db.updateTable('payments').set({ status: 'expired' }).where('shop_id', '=', shopId).where('id', '=', id).where('status', '=', 'open').execute();
}

export interface PaymentWithRefunds extends PaymentRow {
  refunded_minor: number;
  payer_name: string;
}

function withRefunds(db: Db, shopId: string) {
  return db
    .selectFrom('payments')
    .innerJoin('users', 'users.id', 'payments.payer_user_id')
    .selectAll('payments')
    .select((eb) => [
      'users.name as payer_name',
      eb.fn
        .coalesce(
          eb.selectFrom('payment_refunds').select((e) => e.fn.sum<number>('payment_refunds.amount_minor').as('s')).whereRef('payment_refunds.payment_id', '=', 'payments.id'),
          eb.lit(0),
        )
        .as('refunded_minor'),
    ])
    .where('payments.shop_id', '=', shopId);
}

export async function listJobPayments(db: Db, shopId: string, jobId: string): Promise<PaymentWithRefunds[]> {
  const rows = await withRefunds(db, shopId).where('payments.job_id', '=', jobId).orderBy('payments.created_at').execute();
  return rows.map((r) => ({ ...r, refunded_minor: Number(r.refunded_minor) }));
}

export async function findPaymentWithRefunds(db: Db, shopId: string, id: string): Promise<PaymentWithRefunds | undefined> {
  const row = await withRefunds(db, shopId).where('payments.id', '=', id).executeTakeFirst();
  return row && { ...row, refunded_minor: Number(row.refunded_minor) };
}

/** Checkout payments for a job that are neither paid nor expired (a second click reuses them). */
export async function listOpenCheckoutForJob(db: Db, shopId: string, jobId: string): Promise<PaymentRow[]> {
  return db.selectFrom('payments').selectAll().where('shop_id', '=', shopId).where('job_id', '=', jobId).where('status', '=', 'open').execute();
}

/** A refund of a payment, taken off its customer's summary in the same transaction. */
export async function insertPaymentRefund(db: Db, row: InsertablePaymentRefundRow): Promise<PaymentRefundRow> {
  return inTransaction(db, async (trx) => {
    const inserted = await trx.insertInto('payment_refunds').values(row).returningAll().executeTakeFirstOrThrow();
    await addToCustomerSummary(trx, inserted.shop_id, inserted.payment_id, { paidMinor: 0, refundedMinor: inserted.amount_minor }, inserted.created_at);
    return inserted;
  });
}

export async function findRefundByProviderId(db: Db, shopId: string, stripeRefundId: string): Promise<PaymentRefundRow | undefined> {
  return db.selectFrom('payment_refunds').selectAll().where('shop_id', '=', shopId).where('stripe_refund_id', '=', stripeRefundId).executeTakeFirst();
}

export async function listPaymentRefunds(db: Db, shopId: string, paymentId: string): Promise<PaymentRefundRow[]> {
  return db.selectFrom('payment_refunds').selectAll().where('shop_id', '=', shopId).where('payment_id', '=', paymentId).orderBy('created_at').execute();
}

/** One job's money as paid before download reads it: its package's retail price, what was paid and what of that was refunded. */
export interface JobMoneyRow {
  job_id: string;
  dealer_id: string | null;
  payment_lock_waived_at: string | null;
  price_minor: number;
  paid_minor: number;
  refunded_minor: number;
}

/**
 * The money of a customer's jobs in one read (or of one of them, with `jobId`): what the customer side needs to tell
 * which jobs keep their sent revisions locked until paid. Sums come back as numbers on both dialects.
 */
export async function listCustomerJobMoney(db: Db, shopId: string, customerUserId: string, jobId?: string): Promise<JobMoneyRow[]> {
  let query = db
    .selectFrom('jobs')
    .leftJoin('packages', (join) => join.onRef('packages.id', '=', 'jobs.package_id').onRef('packages.shop_id', '=', 'jobs.shop_id'))
    .select((eb) => [
      'jobs.id as job_id',
      'jobs.dealer_id',
      'jobs.payment_lock_waived_at',
      eb.fn.coalesce('packages.retail_price_minor', eb.lit(0)).as('price_minor'),
      eb.fn
        .coalesce(
          eb
            .selectFrom('payments')
            .select((e) => e.fn.sum<number>('payments.amount_minor').as('s'))
            .whereRef('payments.shop_id', '=', 'jobs.shop_id')
            .whereRef('payments.job_id', '=', 'jobs.id')
            .where('payments.status', '=', 'paid'),
          eb.lit(0),
        )
        .as('paid_minor'),
      eb.fn
        .coalesce(
          eb
            .selectFrom('payment_refunds')
            .innerJoin('payments', 'payments.id', 'payment_refunds.payment_id')
            .select((e) => e.fn.sum<number>('payment_refunds.amount_minor').as('s'))
            .whereRef('payments.shop_id', '=', 'jobs.shop_id')
            .whereRef('payments.job_id', '=', 'jobs.id')
            .where('payments.status', '=', 'paid'),
          eb.lit(0),
        )
        .as('refunded_minor'),
    ])
    .where('jobs.shop_id', '=', shopId)
    .where('jobs.customer_user_id', '=', customerUserId);
  if (jobId !== undefined) query = query.where('jobs.id', '=', jobId);
  const rows = await query.orderBy('jobs.id').execute();
  return rows.map((r) => ({ ...r, price_minor: Number(r.price_minor), paid_minor: Number(r.paid_minor), refunded_minor: Number(r.refunded_minor) }));
}
