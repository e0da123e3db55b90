import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { appendLedgerEntry } from '@revloop/db';
import { formatMoney } from '@revloop/domain/billing';
import { createCustomer, createDealer, createMember, createPackage, createShop } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';
import { TEST_VEHICLE } from '../../testing/test-vehicle';

let t: TestApp;
let customerEmail: string;
let ownerEmail: string;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(async () => {
  await t.close();
});

/** The dealer opens a job for its customer, paid wholesale from a topped-up balance. */
async function dealerJob() {
  const shop = await createShop(t, { currency: 'USD' });
  const ridgeline = await createDealer(t, shop, { name: 'Ridgeline Garage' });
  const dealerUser = await createMember(t, shop, 'dealer', { dealer: ridgeline });
  customerEmail = (await createCustomer(t, shop, { dealer: ridgeline })).email;
  ownerEmail = shop.owner.email;
  await appendLedgerEntry(t.db, { shopId: shop.id, dealerId: ridgeline.id, kind: 'top_up', amountMinor: 500_000, currency: 'USD', memo: 'Test top-up', at: t.clock.now().toISOString() });
  const customerUserId = (await t.db.selectFrom('users').select('id').where('email', '=', customerEmail).executeTakeFirstOrThrow()).id;
  const made = await createPackage(t, shop, { retailPriceMinor: 59_900, dealerPriceMinor: 44_900 });
  const pkg = { id: made.id, dealer_price_minor: made.dealerPriceMinor };
  const dealer = await signIn(t.app, dealerUser.email);
  const opened = await dealer.post('/api/jobs').send({ customer: { kind: 'existing', customerUserId }, vehicle: { kind: 'new', vehicle: TEST_VEHICLE }, packageId: pkg.id, goals: 'Stage one', cautionsAccepted: true });
  expect(opened.status).toBe(201);
  return { jobId: opened.body.data.id as string, pkg, dealer };
}

describe('a dealer’s customer never sees the wholesale price or the dealer’s debit', () => {
  it('not in the payments view, the timeline or the mails; the owner and the dealer still do', async () => {
    const { jobId, pkg, dealer } = await dealerJob();
    const wholesale = formatMoney(pkg.dealer_price_minor, 'USD');
    const customer = await signIn(t.app, customerEmail);

    const payments = await customer.get(`/api/billing/jobs/${jobId}/payments`);
    expect(payments.status).toBe(200);
    expect(payments.body.data.paidByDealer).toEqual({ dealerName: 'Ridgeline Garage', amountMinor: null });
    expect(JSON.stringify(payments.body)).not.toContain(String(pkg.dealer_price_minor));

    const job = (await customer.get(`/api/jobs/${jobId}`)).body.data;
    const texts = job.timeline.map((e: { text: string }) => e.text).join('\n');
    expect(texts).not.toMatch(/wholesale|dealer balance/i);
    expect(texts).not.toContain(wholesale);
    expect(JSON.stringify(job)).not.toContain(String(pkg.dealer_price_minor));

    await expect.poll(() => t.mailbox.list().filter((m) => m.to.includes(customerEmail)).length).toBeGreaterThan(0);
    for (const mail of t.mailbox.list().filter((m) => m.to.includes(customerEmail))) {
      expect(`${mail.subject}\n${mail.text}\n${mail.html ?? ''}`).not.toContain(wholesale);
    }

    for (const agent of [dealer, await signIn(t.app, ownerEmail)]) {
      expect((await agent.get(`/api/billing/jobs/${jobId}/payments`)).body.data.paidByDealer).toEqual({ dealerName: 'Ridgeline Garage', amountMinor: pkg.dealer_price_minor });
      const timeline = (await agent.get(`/api/jobs/${jobId}`)).body.data.timeline.map((e: { text: string }) => e.text);
      expect(timeline).toContain(`Paid wholesale from the dealer balance: ${wholesale}`);
    }
  });
});
