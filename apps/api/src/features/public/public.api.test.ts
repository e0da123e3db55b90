import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { updateShop } from '@revloop/db';
import { createPackage, createTwoShops } from '../../testing/factories';
import { createTestApp, linkFromMail, signIn, TEST_ORIGIN, type TestApp } from '../../testing/test-app';
import { TEST_VEHICLE } from '../../testing/test-vehicle';

let t: TestApp;
let w: Awaited<ReturnType<typeof world>>;

const SLUG = 'bench-works';
const OTHER_SLUG = 'other-dyno';
const DESCRIPTION = 'Remote calibration for turbo fours.';

/** A shop with its public page on, two active packages and a retired one, and people in every role; another shop with a page of its own. */
async function world() {
  const two = await createTwoShops(t);
  await updateShop(t.db, two.shop.id, { slug: SLUG, description: DESCRIPTION, public_page: 1 });
  await createPackage(t, two.shop, { name: 'Stage 1', retailPriceMinor: 49_900, dealerPriceMinor: 39_900 });
  await createPackage(t, two.shop, { name: 'Stage 2', modules: ['ECM', 'TCM'], retailPriceMinor: 89_900, dealerPriceMinor: 69_900, roundsIncluded: 4 });
  const retired = await createPackage(t, two.shop, { name: 'Retired', retailPriceMinor: 29_900, dealerPriceMinor: 24_900 });
  // Test set-up: the retired package was switched off by the owner.
  await t.db.updateTable('packages').set({ active: 0 }).where('id', '=', retired.id).execute();
  await updateShop(t.db, two.other.id, { slug: OTHER_SLUG, public_page: 1 });
  await createPackage(t, two.other, { name: 'Other stage' });
  return two;
}

beforeEach(async () => {
  t = await createTestApp();
  w = await world();
});
afterEach(async () => {
  await t.close();
});

const counts = async (shopId: string) => ({
  customers: Number((await t.db.selectFrom('memberships').select((e) => e.fn.countAll().as('n')).where('shop_id', '=', shopId).where('role', '=', 'customer').executeTakeFirstOrThrow()).n),
  vehicles: Number((await t.db.selectFrom('vehicles').select((e) => e.fn.countAll().as('n')).where('shop_id', '=', shopId).executeTakeFirstOrThrow()).n),
  jobs: Number((await t.db.selectFrom('jobs').select((e) => e.fn.countAll().as('n')).where('shop_id', '=', shopId).executeTakeFirstOrThrow()).n),
});

async function firstPackageId(slug: string = SLUG): Promise<string> {
  const res = await request(t.app).get(`/api/public/shops/${slug}`);
  return res.body.data.packages[0].id as string;
}

const startBody = (packageId: string, email = 'new.driver@example.test') => ({
  name: 'Riley Novak',
  email,
  password: 'a-long-enough-password',
  vehicle: { kind: 'new', vehicle: TEST_VEHICLE },
  packageId,
  goals: 'More midrange on 93 octane, stock turbo.',
  cautionsAccepted: true,
});

describe('GET /api/public/shops/:slug', () => {
  it('answers without a session: name, description and active packages with retail prices only', async () => {
    const res = await request(t.app).get(`/api/public/shops/${SLUG}`);
    expect(res.status).toBe(200);
    expect(res.body.data.name).toBe(w.shop.name);
    expect(res.body.data.description).toBe(DESCRIPTION);
    const packages = await t.db.selectFrom('packages').selectAll().where('shop_id', '=', w.shop.id).execute();
    const active = packages.filter((p) => p.active === 1);
    expect(res.body.data.packages).toHaveLength(active.length);
    expect(active.length).toBe(2);
    for (const p of res.body.data.packages) {
      const row = active.find((a) => a.id === p.id)!;
      expect(p.retailPriceMinor).toBe(row.retail_price_minor);
      expect(p.roundsIncluded).toBe(row.rounds_included);
    }
  });

  it('leaks no dealer price, member, dealer or e-mail: checked on the raw JSON', async () => {
    const res = await request(t.app).get(`/api/public/shops/${SLUG}`);
    const raw = res.text;
    expect(raw).not.toMatch(/dealer/i);
    expect(raw).not.toMatch(/@/);
    const packages = await t.db.selectFrom('packages').select(['dealer_price_minor', 'retail_price_minor']).where('shop_id', '=', w.shop.id).execute();
    // Every dealer price that differs from every retail price must be absent as a number.
    const retail = new Set(packages.map((p) => p.retail_price_minor));
    for (const p of packages) if (!retail.has(p.dealer_price_minor)) expect(raw).not.toContain(String(p.dealer_price_minor));
    const people = await t.db
      .selectFrom('memberships')
      .innerJoin('users', 'users.id', 'memberships.user_id')
      .select(['users.name', 'users.email', 'users.id'])
      .where('memberships.shop_id', '=', w.shop.id)
      .execute();
    expect(people.length).toBeGreaterThan(3);
    for (const person of people) {
      expect(raw).not.toContain(person.name);
      expect(raw).not.toContain(person.email);
      expect(raw).not.toContain(person.id);
    }
    expect(Object.keys(res.body.data).sort()).toEqual(['currency', 'description', 'name', 'packages', 'slug']);
    expect(Object.keys(res.body.data.packages[0]).sort()).toEqual(['description', 'id', 'modules', 'name', 'retailPriceMinor', 'roundsIncluded']);
  });

  it('answers 404 for an unknown slug and for a page turned off', async () => {
    expect((await request(t.app).get('/api/public/shops/no-such-shop')).status).toBe(404);
    const owner = await signIn(t.app, w.shop.owner.email);
    expect((await owner.patch('/api/shop').send({ publicPage: false })).status).toBe(200);
    const off = await request(t.app).get(`/api/public/shops/${SLUG}`);
    expect(off.status).toBe(404);
    expect(off.body.error.code).toBe('not_found');
    expect((await request(t.app).post(`/api/public/shops/${SLUG}/start`).send(startBody('x'))).status).toBe(404);
  });
});

describe('shop settings: slug, description, public page', () => {
  it('GET /api/shop returns them; a slug another shop uses answers 409; bad slugs 400', async () => {
    const owner = await signIn(t.app, w.shop.owner.email);
    const shop = await owner.get('/api/shop');
    expect(shop.body.data).toMatchObject({ slug: SLUG, description: DESCRIPTION, publicPage: true });

    const other = await signIn(t.app, w.other.owner.email);
    const clash = await other.patch('/api/shop').send({ slug: SLUG });
    expect(clash.status).toBe(409);
    expect(clash.body.error.message).toContain(`/s/${SLUG}`);
    for (const bad of ['Bench', 'be', '-bench', 'ben--ch', 'ben ch', 'bench-']) {
      expect((await other.patch('/api/shop').send({ slug: bad })).status).toBe(400);
    }
    const moved = await other.patch('/api/shop').send({ slug: 'other-2', description: 'Dyno days every Friday.' });
    expect(moved.status).toBe(200);
    expect(moved.body.data).toMatchObject({ slug: 'other-2', description: 'Dyno days every Friday.', publicPage: true });
    expect((await request(t.app).get('/api/public/shops/other-2')).status).toBe(200);
  });

  it('only the owner changes them', async () => {
    const tuner = await signIn(t.app, w.people.tuner.email);
    expect((await tuner.patch('/api/shop').send({ publicPage: false })).status).toBe(403);
    const customer = await signIn(t.app, w.people.customer.email);
    expect((await customer.patch('/api/shop').send({ slug: 'mine' })).status).toBe(403);
  });
});

describe('Start a tune: sign-up + intake, verified by the e-mailed link', () => {
  it('keeps nothing in the shop until the link is opened, then creates exactly one customer, vehicle and job there', async () => {
    const shopId = w.shop.id;
    const before = await counts(shopId);
    const otherBefore = await counts(w.other.id);
    const packageId = await firstPackageId();

    const start = await request(t.app).post(`/api/public/shops/${SLUG}/start`).send(startBody(packageId));
    expect(start.status).toBe(202);
    expect(start.body.data).toEqual({ sent: true, email: 'new.driver@example.test' });
    expect(await counts(shopId)).toEqual(before);
    expect(await t.db.selectFrom('users').select('id').where('email', '=', 'new.driver@example.test').executeTakeFirst()).toBeUndefined();

    const link = linkFromMail(t.mailbox, 'new.driver@example.test');
    expect(link.startsWith(`${TEST_ORIGIN}/s/${SLUG}/verify?token=`)).toBe(true);
    const token = new URL(link).searchParams.get('token')!;
    const agent = request.agent(t.app);
    const verified = await agent.post(`/api/public/shops/${SLUG}/verify`).send({ token });
    expect(verified.status).toBe(201);
    const jobId = verified.body.data.jobId as string;

    expect(await counts(shopId)).toEqual({ customers: before.customers + 1, vehicles: before.vehicles + 1, jobs: before.jobs + 1 });
    expect(await counts(w.other.id)).toEqual(otherBefore);
    const user = await t.db.selectFrom('users').selectAll().where('email', '=', 'new.driver@example.test').executeTakeFirstOrThrow();
    const memberships = await t.db.selectFrom('memberships').selectAll().where('user_id', '=', user.id).execute();
    expect(memberships.map((m) => [m.shop_id, m.role, m.dealer_id])).toEqual([[shopId, 'customer', null]]);

    // The link signed the customer in and the job is theirs, waiting for the stock read.
    const me = await agent.get('/api/me');
    expect(me.status).toBe(200);
    const job = await agent.get(`/api/jobs/${jobId}`);
    expect(job.status).toBe(200);
    expect(job.body.data).toMatchObject({ state: 'intake', customer: { name: 'Riley Novak', email: 'new.driver@example.test' } });

    // The link works once; the password chosen on the page signs in.
    expect((await request(t.app).post(`/api/public/shops/${SLUG}/verify`).send({ token })).status).toBe(400);
    expect((await request(t.app).post('/api/auth/sign-in').send({ email: 'new.driver@example.test', password: 'a-long-enough-password' })).status).toBe(200);
    expect(await counts(shopId)).toEqual({ customers: before.customers + 1, vehicles: before.vehicles + 1, jobs: before.jobs + 1 });
  });

  it('refuses bad input with a clear 400 and an existing e-mail with 409, keeping nothing', async () => {
    const packageId = await firstPackageId();
    const before = await t.db.selectFrom('public_sign_ups').select('token_hash').execute();
    const noCautions = await request(t.app).post(`/api/public/shops/${SLUG}/start`).send({ ...startBody(packageId), cautionsAccepted: false });
    expect(noCautions.status).toBe(400);
    expect((await request(t.app).post(`/api/public/shops/${SLUG}/start`).send({ ...startBody(packageId), password: 'short' })).status).toBe(400);
    const otherShopsPackage = await firstPackageId(OTHER_SLUG);
    expect((await request(t.app).post(`/api/public/shops/${SLUG}/start`).send(startBody(otherShopsPackage))).status).toBe(400);
    const taken = await request(t.app).post(`/api/public/shops/${SLUG}/start`).send(startBody(packageId, w.people.customer.email));
    expect(taken.status).toBe(409);
    expect(await t.db.selectFrom('public_sign_ups').select('token_hash').execute()).toEqual(before);
    expect(t.mailbox.list().filter((m) => m.subject.startsWith('Confirm your e-mail'))).toHaveLength(0);
  });

  it('a link expires after a day', async () => {
    const packageId = await firstPackageId();
    await request(t.app).post(`/api/public/shops/${SLUG}/start`).send(startBody(packageId));
    const token = new URL(linkFromMail(t.mailbox, 'new.driver@example.test')).searchParams.get('token')!;
    t.clock.advance(24 * 60 * 60_000 + 1000);
    expect((await request(t.app).post(`/api/public/shops/${SLUG}/verify`).send({ token })).status).toBe(400);
  });
});

describe('throttling', () => {
  it('the start and verify POSTs share the sign-up budget per address and answer 429 past it', async () => {
    // The test environment allows 1000 account requests per 15 minutes (app.ts), so the 1001st is refused.
    const limit = 1000;
    const server = t.app.listen(0);
    try {
      // Sent 50 at a time on one listening server: a thousand one-by-one requests outlast the timeout on a busy machine.
      for (let i = 0; i < limit; i += 50) {
        const batch = await Promise.all(Array.from({ length: 50 }, (_, j) => request(server).post(`/api/public/shops/${SLUG}/${(i + j) % 2 ? 'start' : 'verify'}`).send({})));
        expect(batch.map((r) => r.status)).toEqual(Array(50).fill(400));
        if (i === 0) expect(batch[0]!.headers['ratelimit']).toBeDefined();
      }
    } finally {
      server.close();
    }
    const refused = await request(t.app).post(`/api/public/shops/${SLUG}/start`).send({});
    expect(refused.status).toBe(429);
    expect(refused.body.error.code).toBe('rate_limited');
    // Shared with sign-up itself: the same address is now refused there too.
    expect((await request(t.app).post('/api/auth/sign-up').send({})).status).toBe(429);
    // Reading the page is not throttled.
    expect((await request(t.app).get(`/api/public/shops/${SLUG}`)).status).toBe(200);
  }, 90_000);
});
