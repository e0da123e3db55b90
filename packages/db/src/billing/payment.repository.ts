import type { Db } from '../client';
import type { InsertablePaymentRefundRow, InsertablePaymentRow, PaymentRefundRow, PaymentRow } from './billing.table';

export async function insertPayment(db: Db, row: InsertablePaymentRow): Promise<PaymentRow> {
  return db.insertInto('payments').values(row).returningAll().executeTakeFirstOrThrow();
}

export async function findPayment(db: Db, shopId: string, id: string): Promise<PaymentRow | undefined> {
  return db.selectFrom('payments').selectAll().where('shop_id', '=', shopId).where('id', '=', id).executeTakeFirst();
}

/** Webhooks name the Checkout Session only: this maps it back to its payment (platform-level, no session). */
export async function findPaymentByCheckoutSession(db: Db, sessionId: string): Promise<PaymentRow | undefined> {
  return db.selectFrom('payments').selectAll().where('stripe_checkout_session_id', '=', sessionId).executeTakeFirst();
}

/** Marks an open payment paid; false when it was already paid, so its effect is applied once. */
export async function markPaymentPaid(db: Db, shopId: string, id: string, paymentIntentId: string | null, at: string): Promise<boolean> {
  const result = await db
    .updateTable('payments')
    .set({ status: 'paid', stripe_payment_intent_id: paymentIntentId, paid_at: at })
    .where('shop_id', '=', shopId)
    .where('id', '=', id)
    .where('status', '!=', 'paid')
    .executeTakeFirst();
  return Number(result.numUpdatedRows) === 1;
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

export async function insertPaymentRefund(db: Db, row: InsertablePaymentRefundRow): Promise<PaymentRefundRow> {
  return db.insertInto('payment_refunds').values(row).returningAll().executeTakeFirstOrThrow();
}

export async function findRefundByProviderId(db: Db, shopId: string, stripeRefundId: string): Promise<PaymentRefundRow | undefined> {
  return db.selectFrom('payment_refunds').selectAll().where('shop_id', '=', shopId).where('stripe_refund_id', '=', stripeRefundId).executeTakeFirst();
}

export async function listPaymentRefunds(db: Db, shopId: string, paymentId: string): Promise<PaymentRefundRow[]> {
  return db.selectFrom('payment_refunds').selectAll().where('shop_id', '=', shopId).where('payment_id', '=', paymentId).orderBy('created_at').execute();
}
