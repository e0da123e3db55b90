import { describe, expect, it } from 'vitest';
import { insertDealer } from '../dealers/dealer.repository';
import { newId, nowIso } from '../ids';
import { twoShops } from '../testing/two-shops';
import { appendLedgerEntry, dealerBalance, listLedgerEntries } from './ledger.repository';
import { findPayment, findPaymentWithRefunds, insertPayment, insertPaymentRefund, listJobPayments, markPaymentPaid } from './payment.repository';
import { claimStripeEvent } from './stripe-event.repository';
import { findShopSubscription, insertShopSubscription, listShopsWithoutSubscription, upsertSubscriptionInvoice, listSubscriptionInvoices } from './subscription.repository';

async function dealerIn(db: Awaited<ReturnType<typeof twoShops>>['db'], shopId: string) {
  return insertDealer(db, { id: newId(), shop_id: shopId, name: 'Garage', contact_name: 'G', contact_email: 'g@example.test', created_at: nowIso() });
}

describe('billing repositories', () => {
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
