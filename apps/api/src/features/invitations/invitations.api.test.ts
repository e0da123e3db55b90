import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createTwoShops } from '../../testing/factories';
import { createTestApp, linkFromMail, signIn, TEST_PASSWORD, type TestApp } from '../../testing/test-app';

let t: TestApp;
let w: Awaited<ReturnType<typeof createTwoShops>>;
beforeAll(async () => {
  t = await createTestApp();
  w = await createTwoShops(t);
});
afterAll(async () => {
  await t.close();
});

describe('/api/invitations', () => {
  it('the owner invites; the list and the mailed link show the invitation', async () => {
    const owner = await signIn(t.app, w.people.owner.email);
    const sent = await owner.post('/api/invitations').send({ email: 'new.dealer@invite.test', role: 'dealer', dealerId: w.dealer.id });
    expect(sent.status).toBe(201);
    expect(sent.body.data).toMatchObject({ email: 'new.dealer@invite.test', role: 'dealer' });
    const pending = (await owner.get('/api/invitations')).body.data;
    expect(pending).toEqual([expect.objectContaining({ id: sent.body.data.id, dealer: { id: w.dealer.id, name: w.dealer.name } })]);
    const token = linkFromMail(t.mailbox, 'new.dealer@invite.test').split('/invitations/')[1]!;
    expect((await request(t.app).get(`/api/invitations/lookup/${token}`)).body.data).toMatchObject({ email: 'new.dealer@invite.test', role: 'dealer' });
  });

  it('refuses bad input with a 400 and an unknown token with a 404', async () => {
    const owner = await signIn(t.app, w.people.owner.email);
    expect((await owner.post('/api/invitations').send({ email: 'nobody', role: 'tuner' })).status).toBe(400);
    expect((await owner.post('/api/invitations').send({ email: 'x@invite.test', role: 'janitor' })).status).toBe(400);
    expect((await request(t.app).get(`/api/invitations/lookup/${'z'.repeat(40)}`)).status).toBe(404);
  });

  it('lets only the owner invite or read the list', async () => {
    for (const person of [w.people.tuner, w.people.dealer, w.people.customer]) {
      const agent = await signIn(t.app, person.email);
      expect((await agent.post('/api/invitations').send({ email: 'y@invite.test', role: 'customer' })).status).toBe(403);
      expect((await agent.get('/api/invitations')).status).toBe(403);
    }
  });

  it("answers 404 when another shop withdraws this shop's invitation", async () => {
    const owner = await signIn(t.app, w.people.owner.email);
    const sent = await owner.post('/api/invitations').send({ email: 'kept@invite.test', role: 'tuner' });
    const other = await signIn(t.app, w.other.owner.email);
    expect((await other.delete(`/api/invitations/${sent.body.data.id}`)).status).toBe(404);
    expect((await other.get('/api/invitations')).body.data).toEqual([]);
    expect((await owner.get('/api/invitations')).body.data.map((i: { id: string }) => i.id)).toContain(sent.body.data.id);
  });

  it('a person signed in to another shop opens the invitation and joins with it', async () => {
    const owner = await signIn(t.app, w.people.owner.email);
    const elsewhere = await signIn(t.app, w.other.owner.email);
    expect((await owner.post('/api/invitations').send({ email: w.other.owner.email, role: 'tuner' })).status).toBe(201);
    const token = linkFromMail(t.mailbox, w.other.owner.email).split('/invitations/')[1]!;
    const lookup = await elsewhere.get(`/api/invitations/lookup/${token}`);
    expect(lookup.status).toBe(200);
    expect(lookup.body.data).toMatchObject({ role: 'tuner', shopName: w.shop.name, existingAccount: true });
    const accepted = await elsewhere.post('/api/invitations/accept').send({ token, name: w.other.owner.name, password: TEST_PASSWORD });
    expect(accepted.status).toBe(200);
    expect((await elsewhere.get('/api/me')).body).toMatchObject({ shop: { id: w.shop.id }, role: 'tuner' });
  });
});
