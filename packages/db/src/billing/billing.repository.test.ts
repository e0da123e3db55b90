import { describe, expect, it } from 'vitest';
import { insertDealer } from '../dealers/dealer.repository';
import { newId, nowIso } from '../ids';
import { jobIn, twoShops } from '../testing/two-shops';
import { appendLedgerEntry, dealerBalance, listLedgerEntries } from './ledger.repository';
import { findPayment, findPaymentWithRefunds, insertPayment, insertPaymentRefund, listCustomerJobMoney, listJobPayments, markPaymentPaid } from './payment.repository';
import { claimStripeEvent } from './stripe-event.repository';
import { findShopSubscription, insertShopSubscription, listShopsWithoutSubscription, upsertSubscriptionInvoice, listSubscriptionInvoices } from './subscription.repository';

async function dealerIn(db: Awaited<ReturnType<typeof twoShops>>['db'], shopId: string) {
  return insertDealer(db, { id: newId(), shop_id: shopId, name: 'Garage', contact_name: 'G', contact_email: 'g@example.test', created_at: nowIso() });
}

describe('billing repositories', () => {
  it('reads the money of a customer’s jobs in one query: price, paid and refunded per job, only paid payments, only theirs', async () => {
    const { db, shopA, shopB, ownerA, ownerB } = await twoShops();
    const at = nowIso();
    const paidJob = await jobIn(db, shopA, ownerA, { number: 1001, priceMinor: 50000, state: 'with_customer' });
    const unpaidJob = await jobIn(db, shopA, ownerA, { number: 1002, priceMinor: 30000, state: 'with_customer' });
    await jobIn(db, shopA, ownerB, { number: 1003, priceMinor: 10000, state: 'with_customer' });
    await jobIn(db, shopB, ownerA, { number: 1001, priceMinor: 10000, state: 'with_customer' });
    const payment = { shop_id: shopA, purpose: 'job' as const, job_id: paidJob.id, payer_user_id: ownerA, currency: 'USD', created_at: at };
    const paid = await insertPayment(db, { ...payment, id: newId(), amount_minor: 30000, status: 'paid', stripe_checkout_session_id: 'cs_m1', paid_at: at });
    await insertPayment(db, { ...payment, id: newId(), amount_minor: 20000, status: 'open', stripe_checkout_session_id: 'cs_m2' });
    await insertPaymentRefund(db, { id: newId(), shop_id: shopA, payment_id: paid.id, amount_minor: 5000, currency: 'USD', reason: 'goodwill', stripe_refund_id: 're_m1', by_user_id: ownerA, created_at: at });

    // Compared by job number, whatever order a dialect's collation puts the ids in.
    const numberOf = new Map([[paidJob.id, 1001], [unpaidJob.id, 1002]]);
    const money = (rows: Awaited<ReturnType<typeof listCustomerJobMoney>>) =>
      rows.map((r) => [numberOf.get(r.job_id) ?? r.job_id, r.price_minor, r.paid_minor, r.refunded_minor]).sort((a, b) => Number(a[0]) - Number(b[0]));
    expect(money(await listCustomerJobMoney(db, shopA, ownerA))).toEqual([
      [1001, 50000, 30000, 5000],
      [1002, 30000, 0, 0],
    ]);
    expect(money(await listCustomerJobMoney(db, shopA, ownerA, unpaidJob.id))).toEqual([[1002, 30000, 0, 0]]);
    expect(await listCustomerJobMoney(db, shopA, ownerA, 'no-job')).toEqual([]);
  });

  it('read another shop’s subscription, payment and ledger as undefined or empty', async () => {
    const { db, shopA, shopB, ownerB } = await twoShops();
    const at = nowIso();
    await insertShopSubscription(db, { shop_id: shopB, plan_id: 'workshop', seats: 2, status: 'trialing', trial_ends_at: at, current_period_end: null, past_due_since: null, read_only_reason: null, stripe_customer_id: null, stripe_subscription_id: null, provider_clock: null, created_at: at, updated_at: at });
    expect(await findShopSubscription(db, shopA)).toBeUndefined();
    expect((await listShopsWithoutSubscription(db)).map((s) => s.id)).toEqual([shopA]);

    const dealer = await dealerIn(db, shopB);
    const payment = await insertPayment(db, { id: newId(), shop_id: shopB, purpose: 'topup', dealer_id: dealer.id, payer_user_id: ownerB, amount_minor: 5000, currency: 'USD', status: 'open', stripe_checkout_session_id: 'cs_1', created_at: at });
    expect(await findPayment(db, shopA, payment.id)).toBeUndefined();
    expect(await markPaymentPaid(db, shopA, payment.id, 'pi_1', at)).toBe(false);
    expect(await markPaymentPaid(db, shopB, payment.id, 'pi_1', at)).toBe(true);
    expect(await markPaymentPaid(db, shopB, payment.id, 'pi_1', at)).toBe(false);

    await appendLedgerEntry(db, { shopId: shopB, dealerId: dealer.id, kind: 'top_up', amountMinor: 5000, currency: 'USD', paymentId: payment.id, memo: 'Top-up', at });
    expect(await dealerBalance(db, shopA, dealer.id)).toBe(0);
    expect(await listLedgerEntries(db, shopA, dealer.id)).toEqual([]);
    expect(await dealerBalance(db, shopB, dealer.id)).toBe(5000);

    await upsertSubscriptionInvoice(db, { id: 'in_1', shop_id: shopB, status: 'paid', amount_due_minor: 9800, amount_paid_minor: 9800, currency: 'usd', created_at: at, updated_at: at });
    expect(await listSubscriptionInvoices(db, shopA)).toEqual([]);
  });

  it('keeps the ledger append-only with a running balance and one credit per payment', async () => {
    const { db, shopA, ownerA } = await twoShops();
    const at = nowIso();
    const dealer = await dealerIn(db, shopA);
    const payment = await insertPayment(db, { id: newId(), shop_id: shopA, purpose: 'topup', dealer_id: dealer.id, payer_user_id: ownerA, amount_minor: 50000, currency: 'USD', status: 'paid', stripe_checkout_session_id: 'cs_2', created_at: at });
    const credit = { shopId: shopA, dealerId: dealer.id, kind: 'top_up' as const, amountMinor: 50000, currency: 'USD', paymentId: payment.id, memo: 'Top-up', at };
    await appendLedgerEntry(db, credit);
    await appendLedgerEntry(db, { shopId: shopA, dealerId: dealer.id, kind: 'adjustment', amountMinor: -12000, currency: 'USD', memo: 'Correction', at });
    await expect(appendLedgerEntry(db, credit)).rejects.toThrow(/unique constraint/i);
    const entries = await listLedgerEntries(db, shopA, dealer.id);
    expect(entries.map((e) => [e.seq, e.amount_minor, e.balance_after_minor])).toEqual([
      [1, 50000, 50000],
      [2, -12000, 38000],
    ]);
    await expect(db.updateTable('ledger_entries').set({ amount_minor: 1 }).execute()).rejects.toThrow(/append-only/);
    await expect(db.deleteFrom('ledger_entries').execute()).rejects.toThrow(/append-only/);
    await expect(appendLedgerEntry(db, { ...credit, kind: 'job_debit', paymentId: null })).rejects.toThrow(/check constraint/i);
  });

  it('sums refunds per payment and claims a webhook event once', async () => {
    const { db, shopA, ownerA } = await twoShops();
    const at = nowIso();
    const dealer = await dealerIn(db, shopA);
    const payment = await insertPayment(db, { id: newId(), shop_id: shopA, purpose: 'topup', dealer_id: dealer.id, payer_user_id: ownerA, amount_minor: 60000, currency: 'USD', status: 'paid', stripe_checkout_session_id: 'cs_3', created_at: at });
    for (const [amount, id] of [[20000, 're_1'], [5000, 're_2']] as const) {
      await insertPaymentRefund(db, { id: newId(), shop_id: shopA, payment_id: payment.id, amount_minor: amount, currency: 'USD', reason: 'goodwill', stripe_refund_id: id, by_user_id: ownerA, created_at: at });
    }
    expect((await findPaymentWithRefunds(db, shopA, payment.id))?.refunded_minor).toBe(25000);
    expect(await listJobPayments(db, shopA, 'no-job')).toEqual([]);
    expect(await claimStripeEvent(db, { id: 'evt_1', type: 'x', shopId: shopA, at })).toBe(true);
    expect(await claimStripeEvent(db, { id: 'evt_1', type: 'x', shopId: shopA, at })).toBe(false);
  });
});
