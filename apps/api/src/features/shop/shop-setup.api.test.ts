import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { updateShopSubscription } from '@revloop/db';
import { createTwoShops } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(async () => {
  await t.close();
});

const ticks = (res: request.Response) => Object.fromEntries((res.body.data.items as Array<{ id: string; done: boolean }>).map((i) => [i.id, i.done]));

describe('GET /api/shop/setup: the first-run checklist, derived from data', () => {
  it('a new shop starts with nothing done; each item ticks itself as the owner does it', async () => {
    const owner = request.agent(t.app);
    const signUp = await owner.post('/api/auth/sign-up').send({ shopName: 'Bench Co', name: 'Ari Vale', email: 'ari@bench.test', password: 'long-enough-pass' });
    expect(signUp.status).toBe(201);

    let setup = await owner.get('/api/shop/setup');
    expect(setup.status).toBe(200);
    expect(ticks(setup)).toEqual({ package: false, log_requests: false, tuner: false, plan: false, public_page: false });
    expect(setup.body.data.done).toBe(false);

    await owner.post('/api/packages').send({ name: 'Stage 1', description: '', modules: ['ECM'], retailPriceMinor: 49900, dealerPriceMinor: 39900, roundsIncluded: 3 }).expect(201);
    await owner
      .patch('/api/shop')
      .send({ settings: { logRequestDefaults: { 'v8': { channels: ['time', 'rpm'], warmupMinutes: 5, wotGears: 1, notes: '' } } } })
      .expect(200);
    await owner.post('/api/invitations').send({ email: 'tuner@bench.test', role: 'tuner' }).expect(201);
    setup = await owner.get('/api/shop/setup');
    expect(ticks(setup)).toEqual({ package: true, log_requests: true, tuner: true, plan: false, public_page: false });

    // A slug alone is not enough: the page must be on.
    await owner.patch('/api/shop').send({ slug: 'bench-co' }).expect(200);
    expect(ticks(await owner.get('/api/shop/setup')).public_page).toBe(false);
    await owner.patch('/api/shop').send({ publicPage: true }).expect(200);
    expect(ticks(await owner.get('/api/shop/setup')).public_page).toBe(true);

    // The trial every shop starts with is not a chosen plan; a paid subscription is (the webhook sets it in real life).
    const shopId = signUp.body.shop.id as string;
    await updateShopSubscription(t.db, shopId, { status: 'active' });
    setup = await owner.get('/api/shop/setup');
    expect(setup.body.data).toMatchObject({ done: true, slug: 'bench-co' });
  });

  it('a revoked tuner invitation unticks the item again; only the owner reads the checklist', async () => {
    const owner = request.agent(t.app);
    await owner.post('/api/auth/sign-up').send({ shopName: 'Bench Co', name: 'Ari Vale', email: 'ari@bench.test', password: 'long-enough-pass' }).expect(201);
    const invitation = await owner.post('/api/invitations').send({ email: 'tuner@bench.test', role: 'tuner' }).expect(201);
    expect(ticks(await owner.get('/api/shop/setup')).tuner).toBe(true);
    await owner.delete(`/api/invitations/${invitation.body.data.id}`).expect(204);
    expect(ticks(await owner.get('/api/shop/setup')).tuner).toBe(false);

    const { people } = await createTwoShops(t);
    for (const person of [people.tuner, people.customer, people.dealer]) {
      const agent = await signIn(t.app, person.email);
      expect((await agent.get('/api/shop/setup')).status).toBe(403);
    }
  });
});
