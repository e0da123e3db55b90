import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createCustomer, createDealer, createJob, createLedgerEntry, createMember, createPackage, createShop } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';
import { TEST_VEHICLE } from '../../testing/test-vehicle';

let t: TestApp;
let w: Awaited<ReturnType<typeof world>>;
beforeEach(async () => {
  t = await createTestApp();
  w = await world();
});
afterEach(async () => {
  await t.close();
});

/**
 * Two shops with a person in every role (named, so the mail subjects can be checked), a second tuner, a customer of the
 * dealer with a dealer balance to debit, and one package. Jobs are made by each test, in the states it needs.
 */
async function world() {
  const shop = await createShop(t, { ownerName: 'Avery Stone' });
  const dealer = await createDealer(t, shop);
  await createLedgerEntry(t, dealer);
  const people = {
    owner: shop.owner,
    tuner: await createMember(t, shop, 'tuner'),
    tuner2: await createMember(t, shop, 'tuner'),
    dealer: await createMember(t, shop, 'dealer', { dealer }),
    customer: await createCustomer(t, shop, { name: 'Robin Vale' }),
    customer2: await createCustomer(t, shop),
    dealerCustomer: await createCustomer(t, shop, { dealer }),
  };
  const pkg = await createPackage(t, shop);
  const other = await createShop(t);
  return { shop, dealer, people, pkg, other };
}

describe('job lists follow the role', () => {
  it('owner sees every job of the shop; tuner sees own and unassigned; dealer and customer their own', async () => {
    const { people, shop } = w;
    await createJob(t, shop, { customer: people.customer });
    await createJob(t, shop, { customer: people.customer2, tuner: people.tuner });
    await createJob(t, shop, { customer: people.customer2, tuner: people.tuner2 });
    await createJob(t, shop, { customer: people.dealerCustomer });
    await createJob(t, w.other);
    const owner = await signIn(t.app, people.owner.email);
    const all = await owner.get('/api/jobs?pageSize=200');
    expect(all.status).toBe(200);
    expect(all.body.meta.total).toBe(4);

    const tuner = await signIn(t.app, people.tuner.email);
    const mine = (await tuner.get('/api/jobs?pageSize=200')).body.data as Array<{ tuner: { id: string } | null }>;
    // Its own job and the two unassigned ones, not the other tuner's.
    expect(mine).toHaveLength(3);
    expect(mine.every((j) => j.tuner === null || j.tuner.id === people.tuner.id)).toBe(true);

    const dealer = await signIn(t.app, people.dealer.email);
    const dealerJobs = (await dealer.get('/api/jobs?pageSize=200')).body.data as Array<{ dealer: { id: string } | null }>;
    expect(dealerJobs).toHaveLength(1);
    expect(dealerJobs.every((j) => j.dealer?.id === w.dealer.id)).toBe(true);

    const customer = await signIn(t.app, people.customer.email);
    const own = (await customer.get('/api/jobs?pageSize=200')).body.data as Array<{ customer: { email: string } }>;
    expect(own).toHaveLength(1);
    expect(own.every((j) => j.customer.email === people.customer.email)).toBe(true);
  });

  it('filters, sorts and pages on the server', async () => {
    const { shop, people } = w;
    const made = [];
    for (const state of ['intake', 'ready', 'intake', 'ready', 'intake'] as const) made.push(await createJob(t, shop, { state, customer: people.customer }));
    await createJob(t, shop, { customer: people.customer2, tuner: people.tuner });
    const numbers = made.map((j) => j.number);
    const owner = await signIn(t.app, people.owner.email);
    const ready = await owner.get('/api/jobs?state=ready&sort=number&dir=asc');
    expect(ready.body.data.map((j: { state: string }) => j.state)).toEqual(['ready', 'ready']);
    expect(ready.body.data.map((j: { number: number }) => j.number)).toEqual([numbers[1], numbers[3]]);
    const page2 = await owner.get('/api/jobs?pageSize=2&page=2&sort=number&dir=asc');
    expect(page2.body.meta).toMatchObject({ total: 6, page: 2, pageSize: 2, pageCount: 3 });
    expect(page2.body.data.map((j: { number: number }) => j.number)).toEqual([numbers[2], numbers[3]]);
    const unassigned = await owner.get('/api/jobs?tuner=unassigned&pageSize=200');
    expect(unassigned.body.data).toHaveLength(5);
    expect(unassigned.body.data.every((j: { tuner: unknown }) => j.tuner === null)).toBe(true);
    const search = await owner.get(`/api/jobs?q=${numbers[4]}`);
    expect(search.body.data.map((j: { number: number }) => j.number)).toContain(numbers[4]);
  });

  it('exports the filtered list as formula-safe CSV', async () => {
    const owner = await signIn(t.app, w.people.owner.email);
    await owner
      .post('/api/jobs')
      .send({ customer: { kind: 'new', name: '=HYPERLINK("http://x")', email: 'inject@factory.test' }, vehicle: { kind: 'new', vehicle: TEST_VEHICLE }, packageId: w.pkg.id, goals: 'x', cautionsAccepted: true })
      .expect(201);
    const res = await owner.get('/api/jobs/export.csv?state=intake');
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/text\/csv/);
    expect(res.headers['content-disposition']).toMatch(/attachment/);
    // OWASP CSV injection: a cell starting with = is prefixed with a quote so spreadsheets show it as text.
    expect(res.text).toContain(`"'=HYPERLINK(""http://x"")"`);
    expect(res.text.split('\r\n')[0]).toMatch(/^Job,State,Round,Customer/);
  });
});

describe('opening a job', () => {
  it('a customer opens a job for themself with a new vehicle; both sides hear about it', async () => {
    const { people } = w;
    const earlier = await createJob(t, w.shop, { customer: people.customer2 });
    const customer = await signIn(t.app, people.customer.email);
    const res = await customer.post('/api/jobs').send({
      customer: { kind: 'existing', customerUserId: people.customer.id },
      vehicle: { kind: 'new', vehicle: TEST_VEHICLE },
      packageId: w.pkg.id,
      goals: 'More torque for towing.',
      specialRequests: { revLimit: { rpm: 7000, notes: '' } },
      cautionsAccepted: true,
    });
    expect(res.status).toBe(201);
    // Numbers follow on within the shop.
    expect(res.body.data).toMatchObject({ state: 'intake', round: 0, number: earlier.number + 1, customer: { email: people.customer.email } });
    expect(res.body.data.nextStep).toMatch(/stock read/);
    expect(res.body.data.logRequest.warmupMinutes).toBe(5);
    await expect.poll(() => t.mailbox.list().some((m) => m.to.includes(people.customer.email))).toBe(true);
    const mail = t.mailbox.list().find((m) => m.to.includes(people.customer.email));
    expect(mail?.subject).toMatch(/We received your job/);
    expect(mail?.text).toMatch(/closed course or a dyno/);
    const tuner = await signIn(t.app, people.tuner.email);
    const notes = await tuner.get('/api/notifications');
    expect(notes.body.meta.unread).toBeGreaterThan(0);
    expect(notes.body.data[0].title).toMatch(/New job/);
  });

  it('refuses an intake without accepted cautions, and a customer opening for someone else', async () => {
    const customer = await signIn(t.app, w.people.customer.email);
    const noCautions = await customer.post('/api/jobs').send({ customer: { kind: 'existing', customerUserId: 'x' }, vehicle: { kind: 'new', vehicle: TEST_VEHICLE }, packageId: w.pkg.id, goals: 'x', cautionsAccepted: false });
    expect(noCautions.status).toBe(400);
    const other = await customer.post('/api/jobs').send({ customer: { kind: 'existing', customerUserId: w.people.customer2.id }, vehicle: { kind: 'new', vehicle: TEST_VEHICLE }, packageId: w.pkg.id, goals: 'x', cautionsAccepted: true });
    expect(other.status).toBe(400);
  });

  it('a dealer opens a job for its own customer only; the job is a dealer job', async () => {
    const dealer = await signIn(t.app, w.people.dealer.email);
    const customers = (await dealer.get('/api/customers')).body.data as Array<{ id: string; email: string }>;
    expect(customers.map((c) => c.email)).toEqual([w.people.dealerCustomer.email]);
    const ok = await dealer.post('/api/jobs').send({ customer: { kind: 'existing', customerUserId: customers[0]!.id }, vehicle: { kind: 'new', vehicle: TEST_VEHICLE }, packageId: w.pkg.id, goals: 'x', cautionsAccepted: true });
    expect(ok.status).toBe(201);
    expect(ok.body.data.dealer.id).toBe(w.dealer.id);
    const direct = await dealer.post('/api/jobs').send({ customer: { kind: 'existing', customerUserId: w.people.customer.id }, vehicle: { kind: 'new', vehicle: TEST_VEHICLE }, packageId: w.pkg.id, goals: 'x', cautionsAccepted: true });
    expect(direct.status).toBe(400);
  });

  it('a wrong VIN check digit needs confirming; a malformed VIN is an error', async () => {
    const owner = await signIn(t.app, w.people.owner.email);
    const body = (vin: string, vinCheckDigitOverride = false) => ({
      customer: { kind: 'existing', customerUserId: w.people.customer.id },
      vehicle: { kind: 'new', vehicle: { ...TEST_VEHICLE, vin, vinCheckDigitOverride } },
      packageId: w.pkg.id,
      goals: 'x',
      cautionsAccepted: true,
    });
    // REFERENCES.md: 1M8GDM9A1KP042788 has a wrong check digit (the right one is X) [3P].
    expect((await owner.post('/api/jobs').send(body('1M8GDM9A1KP042788'))).status).toBe(400);
    expect((await owner.post('/api/jobs').send(body('1M8GDM9A1KP042788', true))).status).toBe(201);
    expect((await owner.post('/api/jobs').send(body('1M8GDM9AOKP04278', true))).status).toBe(400);
  });
});

describe('moving a job', () => {
  it('a tuner takes a ready job and puts it on the bench; the round rules hold', async () => {
    const job = await createJob(t, w.shop, { state: 'ready' });
    const tuner = await signIn(t.app, w.people.tuner2.email);
    const before = (await tuner.get(`/api/jobs/${job.id}`)).body.data;
    expect(before.transitions.map((x: { to: string }) => x.to)).toContain('on_bench');
    const moved = await tuner.post(`/api/jobs/${job.id}/transitions`).send({ to: 'on_bench' });
    expect(moved.status).toBe(200);
    expect(moved.body.data).toMatchObject({ state: 'on_bench', tuner: { id: w.people.tuner2.id } });
    // Sending needs a revision on file (the vault's job): refused with a plain reason.
    const send = await tuner.post(`/api/jobs/${job.id}/transitions`).send({ to: 'with_customer' });
    expect(send.status).toBe(409);
    expect(send.body.error.code).toBe('invalid_transition');
    const detail = (await tuner.get(`/api/jobs/${job.id}`)).body.data;
    expect(detail.timeline.map((e: { text: string }) => e.text)).toContain('Moved from Ready to On the bench');
  });

  it('customers cannot make shop moves; another tuner’s job is invisible to a tuner', async () => {
    // Sending a job in log review back to the bench is the shop's move.
    const customerJob = await createJob(t, w.shop, { state: 'log_review', customer: w.people.customer });
    const customer = await signIn(t.app, w.people.customer.email);
    expect((await customer.post(`/api/jobs/${customerJob.id}/transitions`).send({ to: 'on_bench' })).status).toBe(403);

    const onBench = await createJob(t, w.shop, { state: 'on_bench', tuner: w.people.tuner2 });
    const tuner1 = await signIn(t.app, w.people.tuner.email);
    expect((await tuner1.get(`/api/jobs/${onBench.id}`)).status).toBe(404);
    expect((await tuner1.post(`/api/jobs/${onBench.id}/transitions`).send({ to: 'on_hold' })).status).toBe(404);
  });

  it('two people moving the same job at once: one wins, the other is told', async () => {
    const job = await createJob(t, w.shop, { state: 'ready' });
    const owner = await signIn(t.app, w.people.owner.email);
    const [a, b] = await Promise.all([
      owner.post(`/api/jobs/${job.id}/transitions`).send({ to: 'on_bench' }),
      owner.post(`/api/jobs/${job.id}/transitions`).send({ to: 'on_bench' }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
  });

  it('the owner assigns; a tuner takes only unassigned jobs', async () => {
    const job = await createJob(t, w.shop);
    const tuner = await signIn(t.app, w.people.tuner.email);
    expect((await tuner.post(`/api/jobs/${job.id}/take`)).body.data.tuner.id).toBe(w.people.tuner.id);
    const tuner2 = await signIn(t.app, w.people.tuner2.email);
    expect((await tuner2.post(`/api/jobs/${job.id}/take`)).status).toBe(404);
    const owner = await signIn(t.app, w.people.owner.email);
    const assigned = await owner.post(`/api/jobs/${job.id}/assign`).send({ tunerId: w.people.tuner2.id });
    expect(assigned.body.data.tuner.id).toBe(w.people.tuner2.id);
    expect((await tuner.post(`/api/jobs/${job.id}/assign`).send({ tunerId: null })).status).toBe(404);
    expect((await owner.post(`/api/jobs/${job.id}/assign`).send({ tunerId: w.people.customer.id })).status).toBe(400);
  });
});

describe('messages', () => {
  it('a customer writes to the shop; the assigned tuner is notified by e-mail', async () => {
    const job = await createJob(t, w.shop, { state: 'log_review', customer: w.people.customer, tuner: w.people.tuner });
    const customer = await signIn(t.app, w.people.customer.email);
    const posted = await customer.post(`/api/jobs/${job.id}/messages`).send({ body: 'Can you raise the rev limit a little?' });
    expect(posted.status).toBe(201);
    const thread = (await customer.get(`/api/jobs/${job.id}/messages`)).body.data;
    expect(thread.at(-1)).toMatchObject({ body: 'Can you raise the rev limit a little?', mine: true });
    // Mail goes out after the commit, without holding up the answer.
    await expect.poll(() => t.mailbox.list().some((m) => m.to.includes(w.people.tuner.email) && /Message from Robin Vale/.test(m.subject))).toBe(true);
  });

  it('an e-mail preference turns the mail off but keeps the in-app notice', async () => {
    const job = await createJob(t, w.shop, { state: 'log_review', customer: w.people.customer });
    const customer = await signIn(t.app, w.people.customer.email);
    expect((await customer.put('/api/notifications/preferences').send({ prefs: { message_received: { email: false } } })).status).toBe(200);
    const owner = await signIn(t.app, w.people.owner.email);
    t.mailbox.clear();
    await owner.post(`/api/jobs/${job.id}/messages`).send({ body: 'Revision 1 comes tomorrow.' }).expect(201);
    expect((await customer.get('/api/notifications')).body.data[0].title).toMatch(/Message from Avery Stone/);
    expect(t.mailbox.list().some((m) => m.to.includes(w.people.customer.email) && /Message from/.test(m.subject))).toBe(false);
  });
});

describe('role × route matrix with another shop’s ids', () => {
  it('every job, vehicle and package route answers 404 for another shop’s ids', async () => {
    const otherJob = await createJob(t, w.other);
    const otherOwner = await signIn(t.app, w.other.owner.email);
    for (const person of [w.people.owner, w.people.tuner, w.people.dealer, w.people.customer]) {
      const { email } = person;
      const agent = await signIn(t.app, email);
      const probes = await Promise.all([
        agent.get(`/api/jobs/${otherJob.id}`),
        agent.post(`/api/jobs/${otherJob.id}/transitions`).send({ to: 'cancelled' }),
        agent.post(`/api/jobs/${otherJob.id}/assign`).send({ tunerId: null }),
        agent.post(`/api/jobs/${otherJob.id}/take`),
        agent.put(`/api/jobs/${otherJob.id}/log-request`).send({ channels: ['rpm'], warmupMinutes: 5, wotGears: 1, notes: '' }),
        agent.get(`/api/jobs/${otherJob.id}/messages`),
        agent.post(`/api/jobs/${otherJob.id}/messages`).send({ body: 'hello' }),
        agent.get(`/api/vehicles/${otherJob.vehicleId}`),
        agent.put(`/api/vehicles/${otherJob.vehicleId}`).send(TEST_VEHICLE),
        agent.put(`/api/packages/${otherJob.package.id}`).send({ name: 'x', modules: ['ECM'], retailPriceMinor: 1, dealerPriceMinor: 1, roundsIncluded: 1 }),
        agent.patch(`/api/packages/${otherJob.package.id}`).send({ active: false }),
      ]);
      for (const res of probes) expect([email, res.status]).toEqual([email, 404]);
    }
    expect((await otherOwner.get(`/api/jobs/${otherJob.id}`)).status).toBe(200);
    expect((await otherOwner.get(`/api/vehicles/${otherJob.vehicleId}`)).status).toBe(200);
  });

  it('dealer and customer never see each other’s jobs inside one shop', async () => {
    const directJob = await createJob(t, w.shop, { customer: w.people.customer });
    const dealerJob = await createJob(t, w.shop, { customer: w.people.dealerCustomer });
    const dealer = await signIn(t.app, w.people.dealer.email);
    expect((await dealer.get(`/api/jobs/${directJob.id}`)).status).toBe(404);
    expect((await dealer.get(`/api/jobs/${dealerJob.id}`)).status).toBe(200);
    const customer = await signIn(t.app, w.people.customer.email);
    expect((await customer.get(`/api/jobs/${directJob.id}`)).status).toBe(200);
    expect((await customer.get(`/api/jobs/${dealerJob.id}`)).status).toBe(404);
    expect((await customer.get(`/api/jobs/${dealerJob.id}/messages`)).status).toBe(404);
  });

  it('only owners manage packages and shop settings; customers do not see dealer prices', async () => {
    const pkgBody = { name: 'Economy', description: '', modules: ['ECM'], retailPriceMinor: 19900, dealerPriceMinor: 14900, roundsIncluded: 2 };
    const owner = await signIn(t.app, w.people.owner.email);
    expect((await owner.post('/api/packages').send(pkgBody)).status).toBe(201);
    expect((await owner.post('/api/packages').send({ ...pkgBody, dealerPriceMinor: 29900 })).status).toBe(400);
    for (const { email } of [w.people.tuner, w.people.dealer, w.people.customer]) {
      const agent = await signIn(t.app, email);
      expect((await agent.post('/api/packages').send(pkgBody)).status).toBe(403);
      expect((await agent.patch('/api/shop').send({ settings: { holdUntilPaid: true } })).status).toBe(403);
    }
    const customer = await signIn(t.app, w.people.customer.email);
    const seen = (await customer.get('/api/packages')).body.data as Array<{ dealerPriceMinor: number | null }>;
    expect(seen.length).toBeGreaterThan(0);
    expect(seen.every((p) => p.dealerPriceMinor === null)).toBe(true);
    expect((await owner.patch('/api/shop').send({ settings: { holdUntilPaid: true } })).body.data.settings.holdUntilPaid).toBe(true);
  });

  it('signed out, every route answers 401', async () => {
    for (const path of ['/api/jobs', '/api/vehicles', '/api/packages', '/api/customers', '/api/notifications', '/api/shop']) {
      expect((await request(t.app).get(path)).status).toBe(401);
    }
  });
});

describe('vehicles', () => {
  it('shows what the numbers mean: speed per gear from ratios and tyre size', async () => {
    const customer = await signIn(t.app, w.people.customer.email);
    const created = await customer.post('/api/vehicles').send({ vehicle: { ...TEST_VEHICLE, transmission: { type: 'manual', gearRatios: [1.0] }, finalDrive: 3.15 } });
    expect(created.status).toBe(201);
    const v = created.body.data;
    // 245/40R20 → D = 20·25.4 + 2·245·0.40 = 704.0 mm, C = π·D = 2211.7 mm [CALC]; 1.00 gear, 3.15 final: 3000 rpm → 126.38 km/h [CALC].
    expect(v.derived.tyreDiameterMm).toBeCloseTo(704.0, 1);
    expect(v.derived.tyreCircumferenceMm).toBeCloseTo(2211.7, 1);
    expect(v.derived.speeds[0].kmhPer1000Rpm * 3).toBeCloseTo(126.38, 2);
    // E10 by the blend rule ≈ 14.10 [CALC].
    expect(v.derived.stoichAfr).toBeCloseTo(14.1, 1);
  });
});
