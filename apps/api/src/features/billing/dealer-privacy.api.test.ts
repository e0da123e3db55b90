import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { appendLedgerEntry } from '@revloop/db';
import { formatMoney } from '@revloop/domain/billing';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';
import { TEST_VEHICLE } from '../../testing/test-vehicle';

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(async () => {
  await t.close();
});

/** The dealer opens a job for its customer Morgan Pryce, paid wholesale from a topped-up balance. */
async function dealerJob() {
  const dealerId = t.ids.kestrel.dealerId!;
  await appendLedgerEntry(t.db, { shopId: t.ids.kestrel.shopId, dealerId, kind: 'top_up', amountMinor: 500_000, currency: 'USD', memo: 'Test top-up', at: t.clock.now().toISOString() });
  const customerUserId = (await t.db.selectFrom('users').select('id').where('email', '=', 'dcustomer@kestrel.test').executeTakeFirstOrThrow()).id;
  const pkg = await t.db.selectFrom('packages').selectAll().where('shop_id', '=', t.ids.kestrel.shopId).where('active', '=', 1).orderBy('name').executeTakeFirstOrThrow();
  const dealer = await signIn(t.app, 'dealer@kestrel.test');
  const opened = await dealer.post('/api/jobs').send({ customer: { kind: 'existing', customerUserId }, vehicle: { kind: 'new', vehicle: TEST_VEHICLE }, packageId: pkg.id, goals: 'Stage one', cautionsAccepted: true });
  expect(opened.status).toBe(201);
  return { jobId: opened.body.data.id as string, pkg, dealer };
}

describe('a dealer’s customer never sees the wholesale price or the dealer’s debit', () => {
  it('not in the payments view, the timeline or the mails; the owner and the dealer still do', async () => {
    const { jobId, pkg, dealer } = await dealerJob();
    const wholesale = formatMoney(pkg.dealer_price_minor, 'USD');
    const customer = await signIn(t.app, 'dcustomer@kestrel.test');

    const payments = await customer.get(`/api/billing/jobs/${jobId}/payments`);
    expect(payments.status).toBe(200);
    expect(payments.body.data.paidByDealer).toEqual({ dealerName: 'Ridgeline Garage', amountMinor: null });
    expect(JSON.stringify(payments.body)).not.toContain(String(pkg.dealer_price_minor));

    const job = (await customer.get(`/api/jobs/${jobId}`)).body.data;
    const texts = job.timeline.map((e: { text: string }) => e.text).join('\n');
    expect(texts).not.toMatch(/wholesale|dealer balance/i);
    expect(texts).not.toContain(wholesale);
    expect(JSON.stringify(job)).not.toContain(String(pkg.dealer_price_minor));

    await expect.poll(() => t.mailbox.list().filter((m) => m.to.includes('dcustomer@kestrel.test')).length).toBeGreaterThan(0);
    for (const mail of t.mailbox.list().filter((m) => m.to.includes('dcustomer@kestrel.test'))) {
      expect(`${mail.subject}\n${mail.text}\n${mail.html ?? ''}`).not.toContain(wholesale);
    }

    for (const agent of [dealer, await signIn(t.app, 'owner@kestrel.test')]) {
      expect((await agent.get(`/api/billing/jobs/${jobId}/payments`)).body.data.paidByDealer).toEqual({ dealerName: 'Ridgeline Garage', amountMinor: pkg.dealer_price_minor });
      const timeline = (await agent.get(`/api/jobs/${jobId}`)).body.data.timeline.map((e: { text: string }) => e.text);
      expect(timeline).toContain(`Paid wholesale from the dealer balance: ${wholesale}`);
    }
  });
});
