import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createJob, createTwoShops, type TestJob } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';

let t: TestApp;
let w: Awaited<ReturnType<typeof createTwoShops>>;
let job: TestJob;
beforeAll(async () => {
  t = await createTestApp();
  w = await createTwoShops(t);
  job = await createJob(t, w.shop);
});
afterAll(async () => {
  await t.close();
});

type Event = { action: string; subjectType: string; subjectId: string; actor: { id: string } | null };

describe('GET /api/audit', () => {
  it('gives the owner the shop’s events with who did them, up to the limit asked', async () => {
    const owner = await signIn(t.app, w.people.owner.email);
    const res = await owner.get('/api/audit');
    expect(res.status).toBe(200);
    const events = res.body.data as Event[];
    expect(events).toContainEqual(expect.objectContaining({ action: 'job.opened', subjectType: 'Job', subjectId: job.id, actor: expect.objectContaining({ id: w.people.owner.id }) }));
    expect(res.body.meta.total).toBe(events.length);
    expect((await owner.get('/api/audit?limit=1')).body.data).toHaveLength(1);
  });

  it('refuses a bad limit with a 400', async () => {
    const owner = await signIn(t.app, w.people.owner.email);
    expect((await owner.get('/api/audit?limit=0')).status).toBe(400);
    expect((await owner.get('/api/audit?limit=501')).status).toBe(400);
  });

  it('is the owner’s alone', async () => {
    for (const person of [w.people.tuner, w.people.dealer, w.people.customer]) {
      expect((await (await signIn(t.app, person.email)).get('/api/audit')).status).toBe(403);
    }
  });

  it("never shows another shop's events", async () => {
    const other = await signIn(t.app, w.other.owner.email);
    const events = (await other.get('/api/audit')).body.data as Event[];
    expect(events.map((e) => e.subjectId)).not.toContain(job.id);
  });
});
