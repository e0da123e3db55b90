import type Stripe from 'stripe';
import {
  appendLedgerEntry,
  findDealer,
  findJob,
  findJobDebit,
  findPackage,
  findPaymentByCheckoutSession,
  findPaymentWithRefunds,
  findRefundByProviderId,
  findShopById,
  findUserById,
  insertPayment,
  insertPaymentRefund,
  listJobPayments,
  listOpenCheckoutForJob,
  listPaymentRefunds,
  markPaymentExpired,
  markPaymentPaid,
  newId,
  type Db,
  type JobListRow,
  type PaymentRow,
  type ShopRow,
} from '@revloop/db';
import type { JobPayments } from '@revloop/contract';
import { DomainError } from '@revloop/domain';
import { asSubject, systemActorFor } from '@revloop/domain/auth';
import { assertRefundable, formatMoney, type RefundInput } from '@revloop/domain/billing';
import type { AppDeps } from '../../context';
import { authorizeRow, type AuthContext } from '../../http/auth-context';
import { recordAudit } from '../audit/audit.service';
import { drainMailOutbox } from '../mail/mail-outbox.service';
import { jobLink, loadJob, transitionJob } from '../jobs/job.service';
import { jobReceiptMail, refundMail, topUpReceiptMail } from './billing.mails';
import { customerDownloadLock } from './download-lock.service';
import { statementLink } from './ledger.service';
import { idOf, stripeFor } from './stripe-client';

type ShopAuth = AuthContext & { shop: ShopRow };

/** The Payment subject a job's payment is checked against: the customer and dealer the job belongs to. */
const jobPaymentSubject = (job: JobListRow) => ({ shopId: job.shop_id, customerUserId: job.customer_user_id, dealerId: job.dealer_id });

async function netPaid(db: Db, shopId: string, jobId: string) {
  const payments = await listJobPayments(db, shopId, jobId);
  const paid = payments.filter((p) => p.status === 'paid');
  const paidMinor = paid.reduce((sum, p) => sum + p.amount_minor, 0);
  const refundedMinor = paid.reduce((sum, p) => sum + p.refunded_minor, 0);
  return { payments, paidMinor, refundedMinor };
}

/** `GET /api/billing/jobs/:id/payments`: the price, what was paid and refunded, and who may pay or refund. */
export async function jobPaymentsView(deps: AppDeps, auth: ShopAuth, jobId: string): Promise<JobPayments> {
  const job = await loadJob(deps.db, auth, jobId);
  authorizeRow(auth, 'read', 'Payment', jobPaymentSubject(job), 'Job not found.');
  const pkg = await findPackage(deps.db, auth.shop.id, job.package_id);
  const priceMinor = pkg?.retail_price_minor ?? 0;
  const { payments, paidMinor, refundedMinor } = await netPaid(deps.db, auth.shop.id, jobId);
  const debit = job.dealer_id ? await findJobDebit(deps.db, auth.shop.id, jobId) : undefined;
  const refundsByPayment = new Map<string, Awaited<ReturnType<typeof listPaymentRefunds>>>();
  for (const p of payments) if (p.refunded_minor > 0) refundsByPayment.set(p.id, await listPaymentRefunds(deps.db, auth.shop.id, p.id));
  const subject = asSubject('Payment', jobPaymentSubject(job));
  return {
    jobId,
    currency: auth.shop.currency,
    priceMinor,
    paidMinor,
    refundedMinor,
    dueMinor: job.dealer_id ? 0 : Math.max(0, priceMinor - (paidMinor - refundedMinor)),
    // The wholesale amount is the dealer's business: only those who may read its ledger see it, never its customers.
    paidByDealer: debit && job.dealer_name ? { dealerName: job.dealer_name, amountMinor: auth.ability.can('read', asSubject('Ledger', { shopId: job.shop_id, dealerId: job.dealer_id })) ? -debit.amount_minor : null } : null,
    payments: payments.map((p) => ({
      id: p.id,
      amountMinor: p.amount_minor,
      currency: p.currency,
      status: p.status,
      payerName: p.payer_name,
      createdAt: p.created_at,
      paidAt: p.paid_at,
      refundedMinor: p.refunded_minor,
      refunds: (refundsByPayment.get(p.id) ?? []).map((r) => ({ id: r.id, amountMinor: r.amount_minor, reason: r.reason, createdAt: r.created_at })),
    })),
    canPay: !job.dealer_id && auth.actor.role === 'customer' && auth.ability.can('create', subject),
    canRefund: auth.ability.can('refund', subject),
    downloadLock: await customerDownloadLock(deps, auth, job),
  };
}

/** Checkout for the job's package at its retail price; a second click reuses the session still open. */
export async function startJobCheckout(deps: AppDeps, auth: ShopAuth, jobId: string): Promise<string> {
  const job = await loadJob(deps.db, auth, jobId);
  authorizeRow(auth, 'create', 'Payment', jobPaymentSubject(job), 'Job not found.');
  if (job.dealer_id) throw new DomainError('conflict', 'This job is paid wholesale from the dealer balance.');
  if (job.state === 'cancelled') throw new DomainError('conflict', 'This job is cancelled.');
  const pkg = await findPackage(deps.db, auth.shop.id, job.package_id);
  const { paidMinor, refundedMinor } = await netPaid(deps.db, auth.shop.id, jobId);
  const due = Math.max(0, (pkg?.retail_price_minor ?? 0) - (paidMinor - refundedMinor));
  if (due === 0) throw new DomainError('conflict', 'This job is already paid.');
  const stripe = stripeFor(deps.env);
  for (const open of await listOpenCheckoutForJob(deps.db, auth.shop.id, jobId)) {
    const session = await stripe.checkout.sessions.retrieve(open.stripe_checkout_session_id).catch(() => null);
    if (session?.status === 'open' && session.url && open.amount_minor === due && open.payer_user_id === auth.user.id) return session.url;
    if (session?.status !== 'complete') await markPaymentExpired(deps.db, auth.shop.id, open.id);
  }
  const paymentId = newId();
  const link = jobLink(deps.env.APP_ORIGIN, jobId);
  const session = await stripe.checkout.sessions.create(
    {
      mode: 'payment',
      line_items: [{ price_data: { currency: auth.shop.currency.toLowerCase(), unit_amount: due, product_data: { name: `${job.package_name} — job ${job.number} (${job.vehicle_description})` } }, quantity: 1 }],
      customer_email: auth.user.email,
      client_reference_id: paymentId,
      metadata: { paymentId, shopId: auth.shop.id, jobId },
      payment_intent_data: { metadata: { paymentId, shopId: auth.shop.id, jobId } },
      success_url: `${link}?payment=done`,
      cancel_url: `${link}?payment=cancelled`,
    },
    { idempotencyKey: `checkout-${paymentId}` },
  );
  await insertPayment(deps.db, {
    id: paymentId,
    shop_id: auth.shop.id,
    purpose: 'job',
    job_id: jobId,
    dealer_id: null,
    payer_user_id: auth.user.id,
    amount_minor: due,
    currency: auth.shop.currency,
    status: 'open',
    stripe_checkout_session_id: session.id,
    created_at: deps.clock.now().toISOString(),
  });
  if (!session.url) throw new DomainError('conflict', 'The payment page could not be opened. Try again.');
  return session.url;
}

/** Checkout that adds to a dealer's prepaid balance; the dealer tops up their own, the owner any of the shop's. */
export async function startTopUpCheckout(deps: AppDeps, auth: ShopAuth, dealerId: string, amountMinor: number): Promise<string> {
  const dealer = await findDealer(deps.db, auth.shop.id, dealerId);
  if (!dealer) throw new DomainError('not_found', 'Dealer not found.');
  authorizeRow(auth, 'read', 'Ledger', { shopId: dealer.shop_id, dealerId: dealer.id }, 'Dealer not found.');
  authorizeRow(auth, 'create', 'Payment', { shopId: auth.shop.id, dealerId }, 'Dealer not found.');
  const paymentId = newId();
  const session = await stripeFor(deps.env).checkout.sessions.create(
    {
      mode: 'payment',
      line_items: [{ price_data: { currency: auth.shop.currency.toLowerCase(), unit_amount: amountMinor, product_data: { name: `Prepaid balance top-up — ${dealer.name}` } }, quantity: 1 }],
      customer_email: auth.user.email,
      client_reference_id: paymentId,
      metadata: { paymentId, shopId: auth.shop.id, dealerId },
      payment_intent_data: { metadata: { paymentId, shopId: auth.shop.id, dealerId } },
      success_url: `${statementLink(deps, dealerId)}?topup=done`,
      cancel_url: statementLink(deps, dealerId),
    },
    { idempotencyKey: `checkout-${paymentId}` },
  );
  await insertPayment(deps.db, {
    id: paymentId,
    shop_id: auth.shop.id,
    purpose: 'topup',
    job_id: null,
    dealer_id: dealerId,
    payer_user_id: auth.user.id,
    amount_minor: amountMinor,
    currency: auth.shop.currency,
    status: 'open',
    stripe_checkout_session_id: session.id,
    created_at: deps.clock.now().toISOString(),
  });
  if (!session.url) throw new DomainError('conflict', 'The payment page could not be opened. Try again.');
  return session.url;
}

/** A paid job that waited on hold for its payment goes back to where it was held: a move the system actor makes. */
async function releasePaymentHold(deps: AppDeps, trx: Db, job: JobListRow): Promise<void> {
  if (job.state !== 'on_hold' || !job.held_from) return;
  await transitionJob(deps, trx, job, job.held_from, { actor: systemActorFor(job.shop_id), causedBy: null }, { auditText: 'Payment received: the job left the hold' });
}

/**
 * Applies a completed payment-mode Checkout once: the payment turns paid, a top-up is credited to the ledger,
 * a job payment lands on its timeline (and releases a payment hold). `claim` records the webhook event in the
 * same transaction.
 */
export async function applyCheckoutPaid(deps: AppDeps, session: Stripe.Checkout.Session, claim: (db: Db) => Promise<boolean>): Promise<void> {
  const payment = await findPaymentByCheckoutSession(deps.db, session.id);
  const now = deps.clock.now();
  const at = now.toISOString();
  const effect = await deps.db.transaction().execute(async (trx) => {
    if (!(await claim(trx)) || !payment || session.payment_status !== 'paid') return null;
    if (!(await markPaymentPaid(trx, payment.shop_id, payment.id, idOf(session.payment_intent), at))) return null;
    const money = formatMoney(payment.amount_minor, payment.currency);
    if (payment.purpose === 'topup' && payment.dealer_id) {
      const entry = await appendLedgerEntry(trx, { shopId: payment.shop_id, dealerId: payment.dealer_id, kind: 'top_up', amountMinor: payment.amount_minor, currency: payment.currency, paymentId: payment.id, memo: 'Top-up through Checkout', createdByUserId: payment.payer_user_id, at });
      await recordAudit(trx, { shopId: payment.shop_id, actorUserId: payment.payer_user_id, action: 'ledger.top_up', subjectType: 'Ledger', subjectId: payment.dealer_id, details: { amountMinor: payment.amount_minor, text: `Balance topped up by ${money}` }, at: now });
      return { payment, balanceMinor: entry.balance_after_minor };
    }
    if (payment.job_id) {
      await recordAudit(trx, { shopId: payment.shop_id, actorUserId: payment.payer_user_id, action: 'payment.received', subjectType: 'Job', subjectId: payment.job_id, details: { paymentId: payment.id, amountMinor: payment.amount_minor, text: `Payment received: ${money}` }, at: now });
      const job = await findJob(trx, payment.shop_id, payment.job_id);
      const pkg = job && (await findPackage(trx, payment.shop_id, job.package_id));
      const { paidMinor, refundedMinor } = await netPaid(trx, payment.shop_id, payment.job_id);
      if (job && pkg && paidMinor - refundedMinor >= pkg.retail_price_minor) await releasePaymentHold(deps, trx, job);
    }
    return { payment, balanceMinor: null };
  });
  await drainMailOutbox(deps);
  if (effect) await sendPaidMail(deps, effect.payment, effect.balanceMinor);
}

async function sendPaidMail(deps: AppDeps, payment: PaymentRow, balanceMinor: number | null): Promise<void> {
  const [payer, shop] = [await findUserById(deps.db, payment.payer_user_id), await findShopById(deps.db, payment.shop_id)];
  if (!payer || !shop) return;
  if (payment.dealer_id && balanceMinor !== null) {
    const dealer = await findDealer(deps.db, payment.shop_id, payment.dealer_id);
    await deps.mailer.send(topUpReceiptMail(payer.email, { shopName: shop.name, dealerName: dealer?.name ?? 'the dealer', amountMinor: payment.amount_minor, balanceMinor, currency: payment.currency, link: statementLink(deps, payment.dealer_id) }));
    return;
  }
  if (!payment.job_id) return;
  const job = await findJob(deps.db, payment.shop_id, payment.job_id);
  if (!job) return;
  await deps.mailer.send(jobReceiptMail(payer.email, { shopName: shop.name, jobNumber: job.number, packageName: job.package_name, amountMinor: payment.amount_minor, currency: payment.currency, link: jobLink(deps.env.APP_ORIGIN, job.id) }));
}

export async function applyCheckoutExpired(deps: AppDeps, session: Stripe.Checkout.Session, claim: (db: Db) => Promise<boolean>): Promise<void> {
  const payment = await findPaymentByCheckoutSession(deps.db, session.id);
  await deps.db.transaction().execute(async (trx) => {
    if ((await claim(trx)) && payment) await markPaymentExpired(trx, payment.shop_id, payment.id);
  });
}

/**
 * Refunds all or part of a paid job payment. The request id makes the provider call idempotent, and the refund
 * is recorded once by the provider's refund id, so a repeated submit never refunds twice.
 */
export async function refundPayment(deps: AppDeps, auth: ShopAuth, paymentId: string, input: RefundInput) {
  const payment = await findPaymentWithRefunds(deps.db, auth.shop.id, paymentId);
  const job = payment?.job_id ? await loadJob(deps.db, auth, payment.job_id).catch(() => undefined) : undefined;
  authorizeRow(auth, 'refund', 'Payment', job && jobPaymentSubject(job), 'Payment not found.');
  if (!payment || payment.status !== 'paid' || !payment.stripe_payment_intent_id) throw new DomainError('conflict', 'Only a paid payment can be refunded.');
  // Checked before the provider is called, so a bad amount never reaches it.
  assertRefundable(payment.amount_minor, payment.refunded_minor, input.amountMinor, payment.currency);
  const stripe = stripeFor(deps.env);
  const refund = await stripe.refunds.create(
    { payment_intent: payment.stripe_payment_intent_id, amount: input.amountMinor, reason: 'requested_by_customer', metadata: { paymentId, shopId: auth.shop.id } },
    { idempotencyKey: `refund-${paymentId}-${input.requestId}` },
  );
  const now = deps.clock.now();
  const recorded = await deps.db.transaction().execute(async (trx) => {
    if (await findRefundByProviderId(trx, auth.shop.id, refund.id)) return false;
    const fresh = (await findPaymentWithRefunds(trx, auth.shop.id, paymentId))!;
    assertRefundable(fresh.amount_minor, fresh.refunded_minor, refund.amount, fresh.currency);
    await insertPaymentRefund(trx, { id: newId(), shop_id: auth.shop.id, payment_id: paymentId, amount_minor: refund.amount, currency: payment.currency, reason: input.reason, stripe_refund_id: refund.id, by_user_id: auth.user.id, created_at: now.toISOString() });
    await recordAudit(trx, { shopId: auth.shop.id, actorUserId: auth.user.id, action: 'payment.refunded', subjectType: 'Job', subjectId: payment.job_id, details: { paymentId, amountMinor: refund.amount, reason: input.reason, text: `Refunded ${formatMoney(refund.amount, payment.currency)}: ${input.reason}` }, at: now });
    return true;
  });
  if (recorded && job) {
    const payer = await findUserById(deps.db, payment.payer_user_id);
    if (payer) await deps.mailer.send(refundMail(payer.email, { shopName: auth.shop.name, jobNumber: job.number, amountMinor: refund.amount, currency: payment.currency, reason: input.reason, link: jobLink(deps.env.APP_ORIGIN, job.id) }));
  }
  return jobPaymentsView(deps, auth, job!.id);
}
