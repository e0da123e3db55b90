import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createCustomer, createJob, createLedgerEntry, createTwoShops } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';

let t: TestApp;
let w: Awaited<ReturnType<typeof createTwoShops>>;
beforeEach(async () => {
  t = await createTestApp();
  w = await createTwoShops(t);
});
afterEach(async () => {
  await t.close();
});

describe('GET /api/dealers/:id for the dealer page', () => {
  it('gives the owner and the dealer user the balance the statement ends on, and the dealer’s job counts', async () => {
    // A top-up, then two jobs for the dealer's customer, each debited at opening; one of them cancelled.
    await createLedgerEntry(t, w.dealer, { amountMinor: 200_000 });
    const customer = await createCustomer(t, w.shop, { dealer: w.dealer });
    await createJob(t, w.shop, { customer });
    await createJob(t, w.shop, { customer, state: 'cancelled' });
    await createJob(t, w.shop); // a direct job, which is not the dealer's
    for (const person of [w.people.owner, w.people.dealer]) {
      const agent = await signIn(t.app, person.email);
      const page = await agent.get(`/api/dealers/${w.dealer.id}`);
      expect(page.status).toBe(200);
      const ledger = (await agent.get(`/api/dealers/${w.dealer.id}/ledger`)).body.data;
      // [CALC] the balance is the sum of every ledger amount, which the last entry's running balance must equal.
      const sum = (ledger.entries as Array<{ amountMinor: number }>).reduce((s, e) => s + e.amountMinor, 0);
      expect(ledger.entries.length).toBeGreaterThanOrEqual(3);
      expect(page.body.data.balance).toEqual({ balanceMinor: sum, currency: 'USD' });
      expect(ledger.balanceMinor).toBe(sum);
      const jobs = await agent.get(`/api/jobs?dealer=${w.dealer.id}&pageSize=200`);
      const open = await agent.get(`/api/jobs?dealer=${w.dealer.id}&open=true&pageSize=200`);
      expect(page.body.data.jobs).toEqual({ total: jobs.body.meta.total, open: open.body.meta.total });
      expect(page.body.data.jobs).toEqual({ total: 2, open: 1 });
    }
  });

  it('hides the balance from a tuner and answers 404 to another shop or a customer', async () => {
    const tuner = await signIn(t.app, w.people.tuner.email);
    expect((await tuner.get(`/api/dealers/${w.dealer.id}`)).body.data.balance).toBeNull();
    expect((await tuner.get(`/api/dealers/${w.dealer.id}/ledger`)).status).toBe(404);
    expect((await (await signIn(t.app, w.other.owner.email)).get(`/api/dealers/${w.dealer.id}`)).status).toBe(404);
    expect((await (await signIn(t.app, w.people.customer.email)).get(`/api/dealers/${w.dealer.id}`)).status).toBe(404);
  });
});
