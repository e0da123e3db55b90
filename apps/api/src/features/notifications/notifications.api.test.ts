import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createJob, createTwoShops } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';

let t: TestApp;
let w: Awaited<ReturnType<typeof createTwoShops>>;
beforeAll(async () => {
  t = await createTestApp();
  w = await createTwoShops(t);
  // Opening a job tells the shop's side (the tuner among them) that it came in.
  await createJob(t, w.shop);
  await createJob(t, w.shop);
});
afterAll(async () => {
  await t.close();
});

type Notice = { id: string; kind: string; readAt: string | null };

describe('/api/notifications', () => {
  it('lists the user’s notices with the unread count, and marks the named ones read', async () => {
    const tuner = await signIn(t.app, w.people.tuner.email);
    const before = (await tuner.get('/api/notifications')).body as { data: Notice[]; meta: { total: number; unread: number } };
    expect(before.data.filter((n) => n.kind === 'job_received')).toHaveLength(2);
    expect(before.meta.unread).toBe(before.data.filter((n) => n.readAt === null).length);
    const read = await tuner.post('/api/notifications/read').send({ ids: [before.data[0]!.id] });
    expect(read.body.data.unread).toBe(before.meta.unread - 1);
    expect((await tuner.post('/api/notifications/read').send({})).body.data.unread).toBe(0);
  });

  it('keeps e-mail preferences per kind and refuses unknown kinds with a 400', async () => {
    const tuner = await signIn(t.app, w.people.tuner.email);
    const saved = await tuner.put('/api/notifications/preferences').send({ prefs: { job_received: { email: false } } });
    expect(saved.status).toBe(200);
    expect(saved.body.data.find((p: { kind: string }) => p.kind === 'job_received').email).toBe(false);
    expect((await tuner.get('/api/notifications/preferences')).body.data.find((p: { kind: string }) => p.kind === 'job_received').email).toBe(false);
    expect((await tuner.put('/api/notifications/preferences').send({ prefs: { fireworks: { email: true } } })).status).toBe(400);
    expect((await tuner.post('/api/notifications/read').send({ ids: 'all' })).status).toBe(400);
  });

  it('answers 401 without a session', async () => {
    expect((await request(t.app).get('/api/notifications')).status).toBe(401);
  });

  it("never shows or marks another shop's notices", async () => {
    const tuner = await signIn(t.app, w.people.tuner.email);
    await createJob(t, w.shop);
    const unread = (await tuner.get('/api/notifications')).body.data.filter((n: Notice) => n.readAt === null) as Notice[];
    expect(unread).toHaveLength(1);
    const other = await signIn(t.app, w.other.owner.email);
    expect((await other.get('/api/notifications')).body.data).toEqual([]);
    expect((await other.post('/api/notifications/read').send({ ids: [unread[0]!.id] })).body.data.unread).toBe(0);
    expect((await tuner.get('/api/notifications')).body.meta.unread).toBe(1);
  });
});
