import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createDemoTestApp } from '../../testing/demo-fixture';
import { signIn } from '../../testing/test-app';

let t: Awaited<ReturnType<typeof createDemoTestApp>>;
beforeEach(async () => {
  t = await createDemoTestApp();
});
afterEach(async () => {
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
    const owner = await signIn(t.app, 'owner@kestrel.test');
    const whole = await all(owner, '&sort=name');
    expect(whole.meta.total).toBe(whole.data.length);
    expect(whole.data.length).toBeGreaterThan(10);
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
    const owner = await signIn(t.app, 'owner@kestrel.test');
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
    const owner = await signIn(t.app, 'owner@kestrel.test');
    const jordan = (await all(owner, '&q=jordan')).data.find((r) => r.email === 'customer@kestrel.test')!;
    const vehicles = (await owner.get(`/api/vehicles?owner=${jordan.id}`)).body.data as unknown[];
    const jobs = (await owner.get(`/api/jobs?customer=${jordan.id}&pageSize=200`)).body.meta.total as number;
    const open = (await owner.get(`/api/jobs?customer=${jordan.id}&open=true&pageSize=200`)).body.meta.total as number;
    expect(jordan).toMatchObject({ vehicleCount: vehicles.length, jobCount: jobs, openJobs: open });
  });

  it('searches name, e-mail, VIN and vehicle description, case-insensitively, and treats % and _ literally', async () => {
    const owner = await signIn(t.app, 'owner@kestrel.test');
    expect((await all(owner, '&q=JORDAN')).data.map((r) => r.email)).toEqual(['customer@kestrel.test']);
    expect((await all(owner, '&q=riley.moss@')).data.map((r) => r.name)).toEqual(['Riley Moss']);
    const vehicle = ((await owner.get('/api/vehicles')).body.data as Array<{ vin: string; description: string; owner: { id: string } }>)[0]!;
    const byVin = (await all(owner, `&q=${vehicle.vin.slice(-8).toLowerCase()}`)).data.map((r) => r.id);
    expect(byVin).toContain(vehicle.owner.id);
    const byDescription = (await all(owner, `&q=${encodeURIComponent(vehicle.description)}`)).data.map((r) => r.id);
    expect(byDescription).toContain(vehicle.owner.id);
    expect((await all(owner, '&q=%25')).meta.total).toBe(0);
    expect((await all(owner, '&q=_')).meta.total).toBe(0);
    expect((await all(owner, '&q=nobody-like-this')).data).toEqual([]);
  });

  it('refuses a bad sort or page size with a 400', async () => {
    const owner = await signIn(t.app, 'owner@kestrel.test');
    expect((await owner.get('/api/customers?sort=password')).status).toBe(400);
    expect((await owner.get('/api/customers?pageSize=0')).status).toBe(400);
  });

  it('scopes by role: tuners see all, a dealer only its own, a customer none', async () => {
    const ownerTotal = (await all(await signIn(t.app, 'owner@kestrel.test'))).meta.total;
    expect((await all(await signIn(t.app, 'tuner@kestrel.test'))).meta.total).toBe(ownerTotal);
    const dealerRows = (await all(await signIn(t.app, 'dealer@kestrel.test'))).data;
    expect(dealerRows.length).toBeGreaterThan(0);
    expect(dealerRows.length).toBeLessThan(ownerTotal);
    expect(dealerRows.every((r) => r.dealer?.id === t.ids.kestrel.dealerId)).toBe(true);
    expect((await (await signIn(t.app, 'customer@kestrel.test')).get('/api/customers')).status).toBe(403);
    // Harbor's list holds none of Kestrel's customers.
    const harbor = (await all(await signIn(t.app, 'owner@harbor.test'))).data.map((r) => r.email);
    expect(harbor.some((e) => e.endsWith('@kestrel.test'))).toBe(false);
  });
});

describe('GET /api/customers/:id', () => {
  it('shows the customer with vehicles, payments and messages', async () => {
    const owner = await signIn(t.app, 'owner@kestrel.test');
    const top = (await all(owner, '&sort=paid&dir=desc')).data[0]!;
    const res = await owner.get(`/api/customers/${top.id}`);
    expect(res.status).toBe(200);
    expect(res.body.data).toMatchObject({ id: top.id, name: top.name, paidMinor: top.paidMinor, currency: 'USD' });
    expect(res.body.data.vehicles).toHaveLength(top.vehicleCount);
    expect(res.body.data.payments.length).toBeGreaterThan(0);
  });

  it('answers 404 for another shop’s customer, a staff user, another dealer’s customer or a customer asking', async () => {
    const kestrel = await signIn(t.app, 'owner@kestrel.test');
    const kRows = (await all(kestrel)).data;
    const direct = kRows.find((r) => r.dealer === null)!;
    const harbor = await signIn(t.app, 'owner@harbor.test');
    expect((await harbor.get(`/api/customers/${direct.id}`)).status).toBe(404);
    const me = (await kestrel.get('/api/me')).body.user.id as string;
    expect((await kestrel.get(`/api/customers/${me}`)).status).toBe(404);
    const dealer = await signIn(t.app, 'dealer@kestrel.test');
    expect((await dealer.get(`/api/customers/${direct.id}`)).status).toBe(404);
    const own = kRows.find((r) => r.dealer?.id === t.ids.kestrel.dealerId)!;
    expect((await dealer.get(`/api/customers/${own.id}`)).status).toBe(200);
    const customer = await signIn(t.app, 'customer@kestrel.test');
    expect((await customer.get(`/api/customers/${direct.id}`)).status).toBe(404);
  });
});
