import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createCustomer, createJob, createLedgerEntry, createPayment, createTwoShops, createVehicle, type TestMember } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';
import { TEST_VEHICLE } from '../../testing/test-vehicle';

let t: TestApp;
let w: Awaited<ReturnType<typeof world>>;

/**
 * One shop with 14 customers (4 of them the dealer's), vehicles, jobs and payments on some, and another shop with
 * a customer of its own: enough rows for two pages of 7 and for every sort to have ties and gaps.
 */
async function world() {
  const two = await createTwoShops(t);
  const { shop, dealer } = two;
  const jordan = two.people.customer;
  const direct: TestMember[] = [jordan];
  for (const name of ['Riley Moss', 'Avery Lane', 'Blake Ortiz', 'Casey Dunn', 'Drew Park', 'Emery Stone', 'Finley Ross', 'Gray Holt', 'Harper Vance']) {
    direct.push(await createCustomer(t, shop, { name, email: `${name.toLowerCase().replace(' ', '.')}@shop.test` }));
  }
  const dealers: TestMember[] = [];
  for (const name of ['Indy Cole', 'Jules Marsh', 'Kai Reed', 'Lane Fox']) dealers.push(await createCustomer(t, shop, { name, dealer }));
  await createLedgerEntry(t, dealer, { amountMinor: 500_000 });
  const wagon = await createVehicle(t, direct[1]!, { ...TEST_VEHICLE, description: 'Blue wagon, 1.5 turbo I3' });
  const paidJob = await createJob(t, shop, { customer: jordan });
  await createPayment(t, paidJob, { amountMinor: 30_000 });
  await createJob(t, shop, { customer: jordan, state: 'cancelled' });
  const rileyJob = await createJob(t, shop, { customer: direct[1]!, vehicle: wagon });
  await createPayment(t, rileyJob, { amountMinor: 12_500 });
  await createJob(t, shop, { customer: dealers[0]! });
  await createVehicle(t, direct[2]!);
  await createCustomer(t, two.other, { name: 'Outside Person' });
  return { ...two, jordan, direct, dealers };
}

// The tests only read, so they share one world.
beforeAll(async () => {
  t = await createTestApp();
  w = await world();
});
afterAll(async () => {
  await t.close();
});

interface Row {
  id: string;
  name: string;
  email: string;
  dealer: { id: string } | null;
  vehicleCount: number;
  openJobs: number;
  jobCount: number;
  lastActivityAt: string;
  paidMinor: number;
}

const all = async (agent: Awaited<ReturnType<typeof signIn>>, query = '') =>
  (await agent.get(`/api/customers?pageSize=500${query}`)).body as { data: Row[]; meta: { total: number } };

describe('GET /api/customers', () => {
  it('pages in order: the pages joined are the whole sorted list, with the total before paging', async () => {
    const owner = await signIn(t.app, w.shop.owner.email);
    const whole = await all(owner, '&sort=name');
    expect(whole.meta.total).toBe(whole.data.length);
    expect(whole.data.length).toBe(w.direct.length + w.dealers.length);
    const names = whole.data.map((r) => r.name);
    // [CP] an ascending name sort puts each name at or after the one before it (SQLite's default BINARY collation).
    expect([...names].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0))).toEqual(names);
    const pages: Row[] = [];
    for (let page = 1; page <= Math.ceil(whole.meta.total / 7); page++) {
      const res = await owner.get(`/api/customers?sort=name&pageSize=7&page=${page}`);
      expect(res.status).toBe(200);
      expect(res.body.meta).toMatchObject({ total: whole.meta.total, page, pageSize: 7, pageCount: Math.ceil(whole.meta.total / 7) });
      pages.push(...res.body.data);
    }
    expect(pages.map((r) => r.id)).toEqual(whole.data.map((r) => r.id));
  });

  it('sorts by open jobs, last activity and money paid, either way', async () => {
    const owner = await signIn(t.app, w.shop.owner.email);
    for (const [sort, key] of [['open_jobs', 'openJobs'], ['paid', 'paidMinor'], ['last_activity', 'lastActivityAt']] as const) {
      for (const dir of ['asc', 'desc'] as const) {
        const values = (await all(owner, `&sort=${sort}&dir=${dir}`)).data.map((r) => r[key]);
        const sorted = [...values].sort((a, b) => (a < b ? -1 : a > b ? 1 : 0));
        expect(values).toEqual(dir === 'asc' ? sorted : sorted.reverse());
      }
    }
    const paid = (await all(owner, '&sort=paid&dir=desc')).data;
    expect(paid[0]!.paidMinor).toBeGreaterThan(0);
  });

  it('counts each customer’s vehicles and jobs as the vehicle and job lists do', async () => {
    const owner = await signIn(t.app, w.shop.owner.email);
    const jordan = (await all(owner)).data.find((r) => r.email === w.jordan.email)!;
    const vehicles = (await owner.get(`/api/vehicles?owner=${jordan.id}`)).body.data as unknown[];
    const jobs = (await owner.get(`/api/jobs?customer=${jordan.id}&pageSize=200`)).body.meta.total as number;
    const open = (await owner.get(`/api/jobs?customer=${jordan.id}&open=true&pageSize=200`)).body.meta.total as number;
    expect(jordan).toMatchObject({ vehicleCount: vehicles.length, jobCount: jobs, openJobs: open });
    // [CALC] the world gave this customer two jobs on their own vehicles, one cancelled.
    expect(jordan).toMatchObject({ vehicleCount: 2, jobCount: 2, openJobs: 1, paidMinor: 30_000 });
  });

  it('searches name, e-mail, VIN and vehicle description, case-insensitively, and treats % and _ literally', async () => {
    const owner = await signIn(t.app, w.shop.owner.email);
    expect((await all(owner, '&q=HARPER')).data.map((r) => r.email)).toEqual(['harper.vance@shop.test']);
    expect((await all(owner, '&q=riley.moss@')).data.map((r) => r.name)).toEqual(['Riley Moss']);
    const vehicle = ((await owner.get('/api/vehicles')).body.data as Array<{ vin: string; description: string; owner: { id: string } }>).find((v) => v.description.startsWith('Blue wagon'))!;
    const byVin = (await all(owner, `&q=${vehicle.vin.slice(-8).toLowerCase()}`)).data.map((r) => r.id);
    expect(byVin).toContain(vehicle.owner.id);
    const byDescription = (await all(owner, `&q=${encodeURIComponent(vehicle.description)}`)).data.map((r) => r.id);
    expect(byDescription).toEqual([vehicle.owner.id]);
    expect((await all(owner, '&q=%25')).meta.total).toBe(0);
    expect((await all(owner, '&q=_')).meta.total).toBe(0);
    expect((await all(owner, '&q=nobody-like-this')).data).toEqual([]);
  });

  it('refuses a bad sort or page size with a 400', async () => {
    const owner = await signIn(t.app, w.shop.owner.email);
    expect((await owner.get('/api/customers?sort=password')).status).toBe(400);
    expect((await owner.get('/api/customers?pageSize=0')).status).toBe(400);
  });

  it('scopes by role: tuners see all, a dealer only its own, a customer none', async () => {
    const ownerTotal = (await all(await signIn(t.app, w.shop.owner.email))).meta.total;
    expect((await all(await signIn(t.app, w.people.tuner.email))).meta.total).toBe(ownerTotal);
    const dealerRows = (await all(await signIn(t.app, w.people.dealer.email))).data;
    expect(dealerRows.length).toBeGreaterThan(0);
    expect(dealerRows.length).toBeLessThan(ownerTotal);
    expect(dealerRows.map((r) => r.id).sort()).toEqual(w.dealers.map((d) => d.id).sort());
    expect(dealerRows.every((r) => r.dealer?.id === w.dealer.id)).toBe(true);
    expect((await (await signIn(t.app, w.jordan.email)).get('/api/customers')).status).toBe(403);
    // The other shop's list holds none of this shop's customers, only its own.
    const other = (await all(await signIn(t.app, w.other.owner.email))).data.map((r) => r.name);
    expect(other).toEqual(['Outside Person']);
  });
});

describe('GET /api/customers/:id', () => {
  it('shows the customer with vehicles, payments and messages', async () => {
    const owner = await signIn(t.app, w.shop.owner.email);
    const top = (await all(owner, '&sort=paid&dir=desc')).data[0]!;
    const res = await owner.get(`/api/customers/${top.id}`);
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ id: top.id, name: top.name, paidMinor: top.paidMinor, currency: 'USD' });
    expect(res.body.data.vehicles).toHaveLength(top.vehicleCount);
    expect(res.body.data.payments.length).toBeGreaterThan(0);
  });

  it('answers 404 for another shop’s customer, a staff user, another dealer’s customer or a customer asking', async () => {
    const owner = await signIn(t.app, w.shop.owner.email);
    const direct = w.direct[1]!;
    const otherOwner = await signIn(t.app, w.other.owner.email);
    expect((await otherOwner.get(`/api/customers/${direct.id}`)).status).toBe(404);
    expect((await owner.get(`/api/customers/${w.people.tuner.id}`)).status).toBe(404);
    expect((await owner.get(`/api/customers/${w.shop.owner.id}`)).status).toBe(404);
    const dealer = await signIn(t.app, w.people.dealer.email);
    expect((await dealer.get(`/api/customers/${direct.id}`)).status).toBe(404);
    expect((await dealer.get(`/api/customers/${w.dealers[0]!.id}`)).status).toBe(200);
    const customer = await signIn(t.app, w.jordan.email);
    expect((await customer.get(`/api/customers/${direct.id}`)).status).toBe(404);
  });
});
