import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createDemoTestApp } from '../../testing/demo-fixture';
import { signIn } from '../../testing/test-app';

let t: Awaited<ReturnType<typeof createDemoTestApp>>;
beforeEach(async () => {
  t = await createDemoTestApp();
});
afterEach(async () => {
  await t.close();
});

describe('GET /api/dealers/:id for the dealer page', () => {
  it('gives the owner and the dealer user the balance the statement ends on, and the dealer’s job counts', async () => {
    const dealerId = t.ids.kestrel.dealerId!;
    for (const email of ['owner@kestrel.test', 'dealer@kestrel.test']) {
      const agent = await signIn(t.app, email);
      const page = await agent.get(`/api/dealers/${dealerId}`);
      expect(page.status).toBe(200);
      const ledger = (await agent.get(`/api/dealers/${dealerId}/ledger`)).body.data;
      // [CALC] the balance is the sum of every ledger amount, which the last entry's running balance must equal.
      const sum = (ledger.entries as Array<{ amountMinor: number }>).reduce((s, e) => s + e.amountMinor, 0);
      expect(page.body.data.balance).toEqual({ balanceMinor: sum, currency: 'USD' });
      expect(ledger.balanceMinor).toBe(sum);
      const jobs = await agent.get(`/api/jobs?dealer=${dealerId}&pageSize=200`);
      const open = await agent.get(`/api/jobs?dealer=${dealerId}&open=true&pageSize=200`);
      expect(page.body.data.jobs).toEqual({ total: jobs.body.meta.total, open: open.body.meta.total });
      expect(page.body.data.jobs.total).toBeGreaterThan(0);
    }
  });

  it('hides the balance from a tuner and answers 404 to another shop or a customer', async () => {
    const dealerId = t.ids.kestrel.dealerId!;
    const tuner = await signIn(t.app, 'tuner@kestrel.test');
    expect((await tuner.get(`/api/dealers/${dealerId}`)).body.data.balance).toBeNull();
    expect((await tuner.get(`/api/dealers/${dealerId}/ledger`)).status).toBe(404);
    expect((await (await signIn(t.app, 'owner@harbor.test')).get(`/api/dealers/${dealerId}`)).status).toBe(404);
    expect((await (await signIn(t.app, 'customer@kestrel.test')).get(`/api/dealers/${dealerId}`)).status).toBe(404);
  });
});
