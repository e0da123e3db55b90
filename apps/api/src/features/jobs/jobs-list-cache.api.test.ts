import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { appendLedgerEntry } from '@revloop/db';
import { createCustomer, createDealer, createJob, createMember, createShop, type TestDealer, type TestMember } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';
import { JobListCache } from './job-list-cache';

let t: TestApp;
let tuners: TestMember[];
let ridgeline: TestDealer;
/**
 * Open jobs that each viewer sees a different part of: two unassigned (one a dealer's customer's), one on each tuner's
 * bench list, two of the shop's own customer.
 */
beforeEach(async () => {
  t = await createTestApp();
  const shop = await createShop(t, { ownerEmail: 'owner@bench.test' });
  ridgeline = await createDealer(t, shop);
  await appendLedgerEntry(t.db, { shopId: shop.id, dealerId: ridgeline.id, kind: 'top_up', amountMinor: 500_000, currency: shop.currency, memo: 'Test top-up', at: t.clock.now().toISOString() });
  tuners = [await createMember(t, shop, 'tuner', { email: 'tuner@bench.test' }), await createMember(t, shop, 'tuner', { email: 'tuner2@bench.test' })];
  await createMember(t, shop, 'dealer', { email: 'dealer@bench.test', dealer: ridgeline });
  const customer = await createCustomer(t, shop, { email: 'customer@bench.test', name: 'Jordan Hale' });
  const other = await createCustomer(t, shop);
  const dcustomer = await createCustomer(t, shop, { email: 'dcustomer@bench.test', dealer: ridgeline });
  await createJob(t, shop, { customer });
  await createJob(t, shop, { state: 'ready', customer, tuner: tuners[0] });
  await createJob(t, shop, { state: 'on_bench', customer: other, tuner: tuners[1] });
  await createJob(t, shop, { customer: dcustomer });
});
afterEach(async () => {
  await t.close();
});

const BOARD = '/api/jobs?open=true&sort=state_changed&dir=asc&pageSize=200';
type ListedJob = { id: string; state: string; tuner: { id: string } | null; customer: { email: string; name: string }; dealer: { id: string } | null; hoursInState: number };

describe('the cached job list', () => {
  it('gives every viewer their own answer: roles and people never see each other’s cached list', async () => {
    const viewers = ['owner@bench.test', 'tuner@bench.test', 'tuner2@bench.test', 'dealer@bench.test', 'customer@bench.test', 'dcustomer@bench.test'];
    const agents = await Promise.all(viewers.map((email) => signIn(t.app, email)));
    // Twice round, so the second round is served from the cache filled by the first, interleaved across viewers.
    const rounds: ListedJob[][][] = [];
    for (let round = 0; round < 2; round++) rounds.push(await Promise.all(agents.map(async (a) => (await a.get(BOARD)).body.data as ListedJob[])));
    expect(rounds[1]).toEqual(rounds[0]);
    const [owner, tuner, tuner2, dealer, customer, dcustomer] = rounds[1]!;
    const [tunerA, tunerB] = tuners.map((p) => p.id);
    expect(tuner!.every((j) => j.tuner === null || j.tuner.id === tunerA)).toBe(true);
    expect(tuner2!.every((j) => j.tuner === null || j.tuner.id === tunerB)).toBe(true);
    expect(tuner!.map((j) => j.id)).not.toEqual(tuner2!.map((j) => j.id));
    expect(dealer!.every((j) => j.dealer?.id === ridgeline.id)).toBe(true);
    expect(customer!.every((j) => j.customer.email === 'customer@bench.test')).toBe(true);
    expect(dcustomer!.every((j) => j.customer.email === 'dcustomer@bench.test')).toBe(true);
    expect(owner!.length).toBeGreaterThan(Math.max(tuner!.length, dealer!.length, customer!.length));
  });

  it('answers a write by anyone at once, including one made straight in the database by another instance', async () => {
    const owner = await signIn(t.app, 'owner@bench.test');
    const tuner = await signIn(t.app, 'tuner@bench.test');
    const before = (await owner.get(BOARD)).body.data as ListedJob[];
    const unassigned = before.find((j) => j.tuner === null && j.state !== 'on_hold')!;
    expect((await tuner.get(BOARD)).status).toBe(200);
    // The tuner takes a job: the owner's cached board must show it taken.
    expect((await tuner.post(`/api/jobs/${unassigned.id}/take`)).status).toBe(200);
    const afterTake = (await owner.get(BOARD)).body.data as ListedJob[];
    expect(afterTake.find((j) => j.id === unassigned.id)!.tuner?.id).toBe(tuners[0]!.id);
    // A rename written by another process reaches this instance through the version the triggers keep.
    await t.db.updateTable('users').set({ name: 'Jordan Hale-Ng' }).where('email', '=', 'customer@bench.test').execute();
    const renamed = (await owner.get(BOARD)).body.data as ListedJob[];
    expect(renamed.filter((j) => j.customer.email === 'customer@bench.test').every((j) => j.customer.name === 'Jordan Hale-Ng')).toBe(true);
  });

  it('keeps hours in state current as time passes with no write, and answers 304 to a matching ETag', async () => {
    const owner = await signIn(t.app, 'owner@bench.test');
    const first = await owner.get(BOARD);
    const again = await owner.get(BOARD).set('If-None-Match', first.headers.etag as string);
    expect(again.status).toBe(304);
    t.clock.advance(3 * 3_600_000);
    const later = await owner.get(BOARD).set('If-None-Match', first.headers.etag as string);
    expect(later.status).toBe(200);
    const hours = new Map((first.body.data as ListedJob[]).map((j) => [j.id, j.hoursInState]));
    for (const j of later.body.data as ListedJob[]) expect(j.hoursInState).toBeCloseTo(hours.get(j.id)! + 3, 5);
  });

  it('keeps at most its cap of answers, dropping the least recently used', () => {
    const cache = new JobListCache(2);
    cache.set('a', 1, 0, 100, '"a"');
    cache.set('b', 1, 0, 100, '"b"');
    expect(cache.get('a', 1, 10)).toBeDefined();
    cache.set('c', 1, 0, 100, '"c"');
    expect(cache.size).toBe(2);
    expect(cache.get('b', 1, 10)).toBeUndefined();
    expect(cache.get('a', 1, 10)).toBeDefined();
    expect(cache.get('a', 2, 10)).toBeUndefined();
    expect(cache.get('a', 1, 100)).toBeUndefined();
  });
});
