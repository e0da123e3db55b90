import express from 'express';
import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { insertMembership, newId, shopScope } from '@revloop/db';
import { testEngine } from '@revloop/db/testing';
import { sessionPolicyOf, secureCookiesOf } from '../features/auth/start-session';
import { singleFileUpload } from '../storage/upload';
import { createJob, createMember, createPlatformAdmin, createShop, type TestShop } from '../testing/factories';
import {
  createTestApp,
  sessionCookieOf,
  TEST_ORIGIN,
  TEST_PASSWORD,
  type TestApp,
} from '../testing/test-app';
import { sessionMiddleware } from './auth-context';
import { errorHandler } from './error-handler';
import { shopScopeMiddleware } from './shop-scope';

let t: TestApp;
let probe: express.Express;
beforeAll(async () => {
  t = await createTestApp();
  // The real session and shop-scope middleware, as app.ts mounts them, before routes that deliberately read every
  // shop's jobs without a shop filter (what a repository bug would do).
  probe = express();
  probe.use(
    sessionMiddleware({
      db: t.db,
      clock: t.clock,
      policy: sessionPolicyOf(t.env),
      secureCookies: secureCookiesOf(t.env),
    }),
    shopScopeMiddleware(t.db),
  );
  const unfilteredJobs = async (req: express.Request, res: express.Response) => {
    // The upload's temporary file goes at once: the data folder is shared with the worker's other test files.
    await t.blobs.discard(req.file?.path);
    const rows = await t.db.selectFrom('jobs').select('shop_id').distinct().execute();
    res.json({ scope: shopScope(), shops: rows.map((r) => r.shop_id).sort() });
  };
  probe.get('/unfiltered', unfilteredJobs);
  // After multer has streamed a body of several chunks (its callback comes from stream events), the scope still holds.
  probe.post(
    '/unfiltered-after-upload',
    singleFileUpload(t.blobs, 'file', () => 2 << 20),
    unfilteredJobs,
  );
  probe.use(errorHandler);
});
afterAll(() => t.close());

async function cookieOf(email: string): Promise<string> {
  const res = await request(t.app)
    .post('/api/auth/sign-in')
    .set('Origin', TEST_ORIGIN)
    .send({ email, password: TEST_PASSWORD });
  expect(res.status).toBe(200);
  return sessionCookieOf(res)!;
}

// SQLite has no row-level security: there the shop filter in each query is the only guard, and this would fail.
describe.skipIf(testEngine() !== 'postgres')('row-level security per request on PostgreSQL', () => {
  let shopA: TestShop;
  let shopB: TestShop;
  beforeAll(async () => {
    shopA = await createShop(t);
    shopB = await createShop(t);
    for (const shop of [shopA, shopB, shopA, shopB]) await createJob(t, shop);
  });

  it('a shop member’s request that reads jobs without a shop filter gets only its own shop’s', async () => {
    for (const shop of [shopA, shopB]) {
      const cookie = await cookieOf(shop.owner.email);
      const res = await request(probe).get('/unfiltered').set('Cookie', cookie);
      expect(res.body).toEqual({ scope: shop.id, shops: [shop.id] });
      const upload = await request(probe)
        .post('/unfiltered-after-upload')
        .set('Cookie', cookie)
        .attach('file', Buffer.alloc(1 << 20, 1), 'x.bin');
      expect(upload.body).toEqual({ scope: shop.id, shops: [shop.id] });
    }
  });

  it('concurrent requests of two shops never see each other’s jobs', async () => {
    const [a, b] = [await cookieOf(shopA.owner.email), await cookieOf(shopB.owner.email)];
    const answers = await Promise.all(
      Array.from({ length: 20 }, async (_, i) => {
        const [cookie, shop] = i % 2 ? [a, shopA] : [b, shopB];
        return {
          shop: shop.id,
          body: (await request(probe).get('/unfiltered').set('Cookie', cookie)).body as {
            shops: string[];
          },
        };
      }),
    );
    for (const { shop, body } of answers) expect(body.shops).toEqual([shop]);
  });

  it('a session read in the shop it had before, but now in another, is read again and runs in its new shop', async () => {
    const person = await createMember(t, shopA, 'tuner');
    await insertMembership(t.db, { id: newId(), shop_id: shopB.id, user_id: person.id, role: 'tuner', created_at: t.clock.now().toISOString() });
    const cookie = await cookieOf(person.email);
    expect((await request(probe).get('/unfiltered').set('Cookie', cookie)).body.scope).toBe(shopA.id);
    await t.db.updateTable('sessions').set({ shop_id: shopB.id }).where('user_id', '=', person.id).execute();
    expect((await request(probe).get('/unfiltered').set('Cookie', cookie)).body).toEqual({ scope: shopB.id, shops: [shopB.id] });
  });

  it('a request without a shop (signed out, platform admin) runs unscoped', async () => {
    const both = [shopA.id, shopB.id].sort();
    expect((await request(probe).get('/unfiltered')).body).toEqual({ scope: null, shops: both });
    const admin = await createPlatformAdmin(t);
    const res = await request(probe)
      .get('/unfiltered')
      .set('Cookie', await cookieOf(admin.email));
    expect(res.body).toEqual({ scope: null, shops: both });
  });
});
