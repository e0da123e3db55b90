import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { testEngine } from '@revloop/db/testing';
import { generateToken, hashToken } from './session.service';
import { createCustomer, createDealer, createMember, createShop } from '../../testing/factories';
import { createTestApp, linkFromMail, sessionCookieOf, signIn, TEST_ORIGIN, TEST_PASSWORD, type TestApp } from '../../testing/test-app';

const DAY = 86_400_000;
let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
  // One shop with the people these tests sign in as, each under a known address.
  const shop = await createShop(t, { name: 'Bench Works', ownerEmail: 'owner@bench.test', ownerName: 'Dana Whitfield' });
  await createMember(t, shop, 'tuner', { email: 'tuner@bench.test' });
  await createMember(t, shop, 'tuner', { email: 'tuner2@bench.test' });
  await createMember(t, shop, 'dealer', { email: 'dealer@bench.test', dealer: await createDealer(t, shop) });
  for (const email of ['customer@bench.test', 'riley.moss@bench.test', 'casey.nguyen@bench.test']) await createCustomer(t, shop, { email });
});
afterEach(async () => {
  await t.close();
});

describe('sign-in and sessions', () => {
  it('answers health without a session', async () => {
    const res = await request(t.app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok' });
  });

  it('answers readiness with the database it reached', async () => {
    const res = await request(t.app).get('/api/health/ready');
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ status: 'ok', database: testEngine() });
  });

  it('signs in with a hardened cookie and answers /api/me', async () => {
    const res = await request(t.app).post('/api/auth/sign-in').send({ email: 'owner@bench.test', password: TEST_PASSWORD });
    expect(res.status).toBe(200);
    const cookie = (res.headers['set-cookie'] as unknown as string[]).find((c) => c.startsWith('revloop_session='))!;
    expect(cookie).toMatch(/HttpOnly/);
    expect(cookie).toMatch(/SameSite=Lax/);
    expect(cookie).not.toMatch(/Secure/); // plain http in tests; Secure is set when APP_ORIGIN is https
    const me = await request(t.app).get('/api/me').set('Cookie', sessionCookieOf(res)!);
    expect(me.status).toBe(200);
    expect(me.body).toMatchObject({
      user: { email: 'owner@bench.test', name: 'Dana Whitfield' },
      role: 'owner',
      shop: { name: 'Bench Works' },
    });
    expect(me.body.user.id).toEqual(expect.any(String));
  });

  it('refuses bad credentials with 401 and the error shape, and /api/me signed out', async () => {
    const bad = await request(t.app).post('/api/auth/sign-in').send({ email: 'owner@bench.test', password: 'wrong-password' });
    expect(bad.status).toBe(401);
    expect(bad.body.error).toMatchObject({ code: 'unauthenticated', message: expect.any(String) });
    const unknown = await request(t.app).post('/api/auth/sign-in').send({ email: 'nobody@bench.test', password: 'whatever-it-is' });
    expect(unknown.status).toBe(401);
    expect((await request(t.app).get('/api/me')).status).toBe(401);
  });

  it('answers the session probe with 200 either way: null signed out, the me-shape signed in', async () => {
    const out = await request(t.app).get('/api/me/session');
    expect(out.status).toBe(200);
    expect(out.body).toEqual({ data: null });
    const res = await request(t.app).post('/api/auth/sign-in').send({ email: 'owner@bench.test', password: TEST_PASSWORD });
    const signedIn = await request(t.app).get('/api/me/session').set('Cookie', sessionCookieOf(res)!);
    expect(signedIn.status).toBe(200);
    expect(signedIn.body.data).toMatchObject({ user: { email: 'owner@bench.test' }, role: 'owner' });
  });

  it('gives a new session id at each sign-in, and a signed-out cookie is dead', async () => {
    const first = await request(t.app).post('/api/auth/sign-in').send({ email: 'tuner@bench.test', password: TEST_PASSWORD });
    const second = await request(t.app).post('/api/auth/sign-in').send({ email: 'tuner@bench.test', password: TEST_PASSWORD });
    const c1 = sessionCookieOf(first)!;
    const c2 = sessionCookieOf(second)!;
    expect(c1).not.toEqual(c2);
    const out = await request(t.app).post('/api/auth/sign-out').set('Cookie', c1);
    expect(out.status).toBe(204);
    expect((await request(t.app).get('/api/me').set('Cookie', c1)).status).toBe(401);
    expect((await request(t.app).get('/api/me').set('Cookie', c2)).status).toBe(200);
  });

  it('slides the idle expiry and stops at the absolute lifetime (fake clock)', async () => {
    const res = await request(t.app).post('/api/auth/sign-in').send({ email: 'customer@bench.test', password: TEST_PASSWORD });
    const cookie = sessionCookieOf(res)!;
    // Idle 7 days, absolute 30 days (defaults). Day 2: no renewal needed yet.
    t.clock.advance(2 * DAY);
    const early = await request(t.app).get('/api/me').set('Cookie', cookie);
    expect(early.status).toBe(200);
    expect(sessionCookieOf(early)).toBeUndefined();
    // Day 6: past half the idle window, so the session is renewed with a fresh cookie expiry.
    t.clock.advance(4 * DAY);
    const renewed = await request(t.app).get('/api/me').set('Cookie', cookie);
    expect(renewed.status).toBe(200);
    expect(sessionCookieOf(renewed)).toBe(cookie);
    // Keep using it every 6 days: alive until day 30, dead after, however active.
    for (let day = 12; day < 30; day += 6) {
      t.clock.advance(6 * DAY);
      expect((await request(t.app).get('/api/me').set('Cookie', cookie)).status).toBe(200);
    }
    t.clock.advance(6 * DAY);
    expect((await request(t.app).get('/api/me').set('Cookie', cookie)).status).toBe(401);
  });

  it('expires an idle session after the idle window', async () => {
    const res = await request(t.app).post('/api/auth/sign-in').send({ email: 'customer@bench.test', password: TEST_PASSWORD });
    t.clock.advance(7 * DAY + 1000);
    expect((await request(t.app).get('/api/me').set('Cookie', sessionCookieOf(res)!)).status).toBe(401);
  });

  it('refuses cross-site state-changing requests', async () => {
    const agent = await signIn(t.app, 'owner@bench.test');
    const foreign = await agent.post('/api/dealers').set('Origin', 'https://evil.example').send({ name: 'X Garage', contactName: 'X', contactEmail: 'x@example.test' });
    expect(foreign.status).toBe(403);
    const site = await agent.post('/api/dealers').set('Sec-Fetch-Site', 'cross-site').send({ name: 'X Garage', contactName: 'X', contactEmail: 'x@example.test' });
    expect(site.status).toBe(403);
    const own = await agent.post('/api/dealers').set('Origin', TEST_ORIGIN).set('Sec-Fetch-Site', 'same-origin').send({ name: 'X Garage', contactName: 'X', contactEmail: 'x@example.test' });
    expect(own.status).toBe(201);
  });
});

describe('sign-in throttling', () => {
  const attempt = (ip: string, password: string) =>
    request(t.app).post('/api/auth/sign-in').set('X-Forwarded-For', ip).send({ email: 'tuner@bench.test', password });

  it('answers 429 with Retry-After after repeated failures from one address', async () => {
    for (let i = 0; i < 5; i++) expect((await attempt('203.0.113.7', 'wrong-password')).status).toBe(401);
    const blocked = await attempt('203.0.113.7', TEST_PASSWORD);
    expect(blocked.status).toBe(429);
    expect(Number(blocked.headers['retry-after'])).toBeGreaterThan(0);
    expect(blocked.body.error.code).toBe('rate_limited');
  });

  it('lets the real user in from a clean address while the account is under attack', async () => {
    for (let n = 0; n < 25; n++) await attempt(`198.51.100.${n}`, 'wrong-password');
    expect((await attempt('198.51.100.3', 'wrong-password')).status).toBe(429);
    expect((await attempt('192.0.2.10', TEST_PASSWORD)).status).toBe(200);
  });

  it('checks at most the limit of a burst of 40 parallel guesses; the rest answer 429', async () => {
    const burst = await Promise.all(Array.from({ length: 40 }, () => attempt('203.0.113.20', 'wrong-password')));
    const statuses = burst.map((r) => r.status);
    // The account+address limit is 5 failures per 15 minutes (DEFAULT_THROTTLE).
    expect(statuses.filter((s) => s === 401).length).toBeLessThanOrEqual(5);
    expect(statuses.filter((s) => s === 429).length).toBeGreaterThanOrEqual(35);
    expect(statuses.every((s) => s === 401 || s === 429)).toBe(true);
    // The real password is not tried either while the pair is blocked.
    expect((await attempt('203.0.113.20', TEST_PASSWORD)).status).toBe(429);
  });

  it('does not count successful sign-ins against the address: an office of 40 signs in', async () => {
    for (let i = 0; i < 40; i++) expect((await attempt('203.0.113.30', TEST_PASSWORD)).status).toBe(200);
  });

  const office = '203.0.113.40';
  const guess = (email: string, password = 'wrong-password', cookie?: string) => {
    const req = request(t.app).post('/api/auth/sign-in').set('X-Forwarded-For', office);
    return (cookie ? req.set('Cookie', cookie) : req).send({ email, password });
  };
  /** 30 wrong passwords from the office address, 5 each on six accounts (so no account+address pair is over). */
  const thirtyFailures = async () => {
    for (const who of ['tuner@bench.test', 'tuner2@bench.test', 'dealer@bench.test', 'riley.moss@bench.test', 'casey.nguyen@bench.test', 'nobody@bench.test']) {
      for (let i = 0; i < 5; i++) expect((await guess(who)).status).toBe(401);
    }
  };

  it('30 failures from one address do not lock out an account that never failed there, from another browser', async () => {
    await thirtyFailures();
    // An account that failed from the office is blocked there now…
    expect((await guess('tuner@bench.test', TEST_PASSWORD)).status).toBe(429);
    // …but a colleague who never failed signs in from a fresh browser on the same address.
    expect((await guess('owner@bench.test', TEST_PASSWORD)).status).toBe(200);
  });

  it('a browser that signed in before keeps its own budget for its account while the address is blocked', async () => {
    const browser = await guess('tuner@bench.test', TEST_PASSWORD);
    const device = ((browser.headers['set-cookie'] as unknown as string[]) ?? []).find((c) => c.startsWith('revloop_device='))?.split(';')[0];
    expect(device).toMatch(/^revloop_device=[\w-]+\.[\w-]+$/);
    await thirtyFailures();
    expect((await guess('tuner@bench.test', TEST_PASSWORD)).status).toBe(429);
    expect((await guess('tuner@bench.test', TEST_PASSWORD, device)).status).toBe(200);
    // A forged cookie, or one for another account, buys nothing.
    expect((await guess('tuner@bench.test', TEST_PASSWORD, 'revloop_device=made-up.value')).status).toBe(429);
    expect((await guess('tuner2@bench.test', TEST_PASSWORD, device)).status).toBe(429);
  });

  it('lifts the block once the window has passed', async () => {
    for (let i = 0; i < 5; i++) await attempt('203.0.113.9', 'wrong-password');
    expect((await attempt('203.0.113.9', TEST_PASSWORD)).status).toBe(429);
    t.clock.advance(16 * 60_000);
    expect((await attempt('203.0.113.9', TEST_PASSWORD)).status).toBe(200);
  });
});

describe('sign-up and password reset', () => {
  it('creates a shop and its owner', async () => {
    const res = await request(t.app)
      .post('/api/auth/sign-up')
      .send({ shopName: 'Test Bench Co', name: 'Ari Test', email: 'ari@bench.test', password: 'long-enough-pass' });
    expect(res.status).toBe(201);
    expect(res.body).toMatchObject({ role: 'owner', shop: { name: 'Test Bench Co' } });
    const again = await request(t.app)
      .post('/api/auth/sign-up')
      .send({ shopName: 'Other', name: 'Ari', email: 'ari@bench.test', password: 'long-enough-pass' });
    expect(again.status).toBe(409);
  });

  it('resets a password through the e-mailed link once, and ends old sessions', async () => {
    const agent = await signIn(t.app, 'tuner2@bench.test');
    const ask = await request(t.app).post('/api/auth/password-reset').send({ email: 'tuner2@bench.test' });
    expect(ask.status).toBe(202);
    const unknown = await request(t.app).post('/api/auth/password-reset').send({ email: 'ghost@bench.test' });
    expect(unknown.status).toBe(202);
    const token = new URL(linkFromMail(t.mailbox, 'tuner2@bench.test')).searchParams.get('token')!;
    const done = await request(t.app).post('/api/auth/password-reset/confirm').send({ token, password: 'a-brand-new-secret' });
    expect(done.status).toBe(204);
    expect((await agent.get('/api/me')).status).toBe(401);
    const reuse = await request(t.app).post('/api/auth/password-reset/confirm').send({ token, password: 'another-new-secret' });
    expect(reuse.status).toBe(400);
    await signIn(t.app, 'tuner2@bench.test', 'a-brand-new-secret');
  });

  const resetTokens = () =>
    t.mailbox
      .list()
      .filter((m) => m.to.includes('tuner2@bench.test'))
      .map((m) => new URL(m.text.match(new RegExp(`${TEST_ORIGIN}\\S+`))![0]).searchParams.get('token')!);
  const confirm = (token: string, password: string) => request(t.app).post('/api/auth/password-reset/confirm').send({ token, password });

  it('asking for a new reset link ends the ones sent before', async () => {
    await request(t.app).post('/api/auth/password-reset').send({ email: 'tuner2@bench.test' });
    const [first] = resetTokens();
    await request(t.app).post('/api/auth/password-reset').send({ email: 'tuner2@bench.test' });
    const newest = resetTokens().find((tok) => tok !== first)!;
    expect((await confirm(first!, 'a-brand-new-secret')).status).toBe(400);
    expect((await confirm(newest, 'a-brand-new-secret')).status).toBe(204);
  });

  it('using a reset link ends every other outstanding link of the account', async () => {
    await request(t.app).post('/api/auth/password-reset').send({ email: 'tuner2@bench.test' });
    const [first] = resetTokens();
    // A second link issued while the first is out (e.g. two requests racing): the database holds both.
    const second = generateToken();
    await t.db.insertInto('password_resets').values({ token_hash: hashToken(second), user_id: (await t.db.selectFrom('users').select('id').where('email', '=', 'tuner2@bench.test').executeTakeFirstOrThrow()).id, created_at: t.clock.now().toISOString(), expires_at: new Date(t.clock.now().getTime() + 3_600_000).toISOString(), used_at: null }).execute();
    expect((await confirm(first!, 'a-brand-new-secret')).status).toBe(204);
    expect((await confirm(second, 'another-new-secret')).status).toBe(400);
    const open = await t.db.selectFrom('password_resets').select('token_hash').where('used_at', 'is', null).execute();
    expect(open).toEqual([]);
  });
});
