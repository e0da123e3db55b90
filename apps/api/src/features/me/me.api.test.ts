import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { insertMembership, newId } from '@revloop/db';
import { createCustomer, createJob, createMember, createShop } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(async () => {
  await t.close();
});

describe('PATCH /api/me', () => {
  it('answers 400 when there is nothing to change (empty body or only unknown keys)', async () => {
    const tuner = await createMember(t, await createShop(t), 'tuner');
    const agent = await signIn(t.app, tuner.email);
    for (const body of [{}, { colour: 'red' }, { platformAdmin: true }]) {
      const res = await agent.patch('/api/me').send(body);
      expect(res.status).toBe(400);
      expect(res.body.error).toMatchObject({ code: 'validation', message: expect.stringMatching(/Nothing to change/) });
    }
    const ok = await agent.patch('/api/me').send({ unitSystem: 'imperial' });
    expect(ok.status).toBe(200);
  });

  it('a new name shows at once on the job lists of every shop the person belongs to, not only the one signed in to', async () => {
    const [shopA, shopB] = [await createShop(t), await createShop(t)];
    const customer = await createCustomer(t, shopB, { name: 'Old Name' });
    await createJob(t, shopB, { customer });
    // The person also works in shop A, their older membership, so they sign in there.
    await insertMembership(t.db, { id: newId(), shop_id: shopA.id, user_id: customer.id, role: 'tuner', created_at: '2000-01-01T00:00:00.000Z' });
    const ownerB = await signIn(t.app, shopB.owner.email);
    const customerNames = async () => ((await ownerB.get('/api/jobs')).body.data as Array<{ customer: { name: string } }>).map((j) => j.customer.name);
    expect(await customerNames()).toEqual(['Old Name']);
    const person = await signIn(t.app, customer.email);
    expect((await person.get('/api/me')).body.shop.id).toBe(shopA.id);
    expect((await person.patch('/api/me').send({ name: 'New Name' })).status).toBe(200);
    expect(await customerNames()).toEqual(['New Name']);
  });
});
