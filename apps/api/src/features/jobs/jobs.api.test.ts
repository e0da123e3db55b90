import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createDemoTestApp } from '../../testing/demo-fixture';
import { signIn } from '../../testing/test-app';
import { TEST_VEHICLE } from '../../testing/test-vehicle';

let t: Awaited<ReturnType<typeof createDemoTestApp>>;
beforeEach(async () => {
  t = await createDemoTestApp();
});
afterEach(async () => {
  await t.close();
});

const kestrelJob = (pred: (j: (typeof t)['ids']['jobs'][number]) => boolean) => {
  const job = t.ids.jobs.find((j) => j.shopId === t.ids.kestrel.shopId && pred(j));
  if (!job) throw new Error('no such seeded job');
  return job;
};


async function firstPackageId(agent: ReturnType<typeof request.agent>) {
  return (await agent.get('/api/packages')).body.data[0].id as string;
}

describe('job lists follow the role', () => {
  it('owner sees every job of the shop; tuner sees own and unassigned; dealer and customer their own', async () => {
    const owner = await signIn(t.app, 'owner@kestrel.test');
    const all = await owner.get('/api/jobs?pageSize=200');
    expect(all.status).toBe(200);
    expect(all.body.meta.total).toBe(40);

    const tuner = await signIn(t.app, 'tuner@kestrel.test');
    const mine = (await tuner.get('/api/jobs?pageSize=200')).body.data as Array<{ tuner: { id: string } | null }>;
    expect(mine.length).toBeGreaterThan(0);
    expect(mine.every((j) => j.tuner === null || j.tuner.id === t.ids.kestrel.tunerIds[0])).toBe(true);

    const dealer = await signIn(t.app, 'dealer@kestrel.test');
    const dealerJobs = (await dealer.get('/api/jobs?pageSize=200')).body.data as Array<{ dealer: { id: string } | null }>;
    expect(dealerJobs.length).toBeGreaterThan(0);
    expect(dealerJobs.every((j) => j.dealer?.id === t.ids.kestrel.dealerId)).toBe(true);

    const customer = await signIn(t.app, 'customer@kestrel.test');
    const own = (await customer.get('/api/jobs?pageSize=200')).body.data as Array<{ customer: { email: string } }>;
    expect(own.length).toBeGreaterThan(0);
    expect(own.every((j) => j.customer.email === 'customer@kestrel.test')).toBe(true);
  });

  it('filters, sorts and pages on the server', async () => {
    const owner = await signIn(t.app, 'owner@kestrel.test');
    const ready = await owner.get('/api/jobs?state=ready&sort=number&dir=asc');
    expect(ready.body.data.map((j: { state: string }) => j.state)).toEqual(Array(5).fill('ready'));
    const numbers = ready.body.data.map((j: { number: number }) => j.number);
    expect(numbers).toEqual([...numbers].sort((a, b) => a - b));
    const page2 = await owner.get('/api/jobs?pageSize=15&page=2&sort=number&dir=asc');
    expect(page2.body.meta).toMatchObject({ total: 40, page: 2, pageSize: 15, pageCount: 3 });
    expect(page2.body.data[0].number).toBe(1016);
    const unassigned = await owner.get('/api/jobs?tuner=unassigned&pageSize=200');
    expect(unassigned.body.data.every((j: { tuner: unknown }) => j.tuner === null)).toBe(true);
    const search = await owner.get('/api/jobs?q=1007');
    expect(search.body.data.map((j: { number: number }) => j.number)).toContain(1007);
  });

  it('exports the filtered list as formula-safe CSV', async () => {
    const owner = await signIn(t.app, 'owner@kestrel.test');
    const pkg = await firstPackageId(owner);
    await owner
      .post('/api/jobs')
      .send({ customer: { kind: 'new', name: '=HYPERLINK("http://x")', email: 'inject@kestrel.test' }, vehicle: { kind: 'new', vehicle: TEST_VEHICLE }, packageId: pkg, goals: 'x', cautionsAccepted: true });
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
    const customer = await signIn(t.app, 'customer@kestrel.test');
    const me = (await customer.get('/api/me')).body;
    const res = await customer.post('/api/jobs').send({
      customer: { kind: 'existing', customerUserId: me.user.id },
      vehicle: { kind: 'new', vehicle: TEST_VEHICLE },
      packageId: await firstPackageId(customer),
      goals: 'More torque for towing.',
      specialRequests: { revLimit: { rpm: 7000, notes: '' } },
      cautionsAccepted: true,
    });
    expect(res.status).toBe(201);
    expect(res.body.data).toMatchObject({ state: 'intake', round: 0, number: 1041, customer: { email: 'customer@kestrel.test' } });
    expect(res.body.data.nextStep).toMatch(/stock read/);
    expect(res.body.data.logRequest.warmupMinutes).toBe(5);
    const mail = t.mailbox.list().find((m) => m.to.includes('customer@kestrel.test'));
    expect(mail?.subject).toMatch(/We received your job/);
    expect(mail?.text).toMatch(/closed course or a dyno/);
    const tuner = await signIn(t.app, 'tuner@kestrel.test');
    const notes = await tuner.get('/api/notifications');
    expect(notes.body.meta.unread).toBeGreaterThan(0);
    expect(notes.body.data[0].title).toMatch(/New job/);
  });

  it('refuses an intake without accepted cautions, and a customer opening for someone else', async () => {
    const customer = await signIn(t.app, 'customer@kestrel.test');
    const pkg = await firstPackageId(customer);
    const noCautions = await customer.post('/api/jobs').send({ customer: { kind: 'existing', customerUserId: 'x' }, vehicle: { kind: 'new', vehicle: TEST_VEHICLE }, packageId: pkg, goals: 'x', cautionsAccepted: false });
    expect(noCautions.status).toBe(400);
    const other = await customer.post('/api/jobs').send({ customer: { kind: 'existing', customerUserId: t.ids.kestrel.customerIds[1] }, vehicle: { kind: 'new', vehicle: TEST_VEHICLE }, packageId: pkg, goals: 'x', cautionsAccepted: true });
    expect(other.status).toBe(400);
  });

  it('a dealer opens a job for its own customer only; the job is a dealer job', async () => {
    const dealer = await signIn(t.app, 'dealer@kestrel.test');
    const customers = (await dealer.get('/api/customers')).body.data as Array<{ id: string; email: string }>;
    expect(customers.map((c) => c.email).sort()).toEqual(['dcustomer@kestrel.test', 'taylor.reyes@kestrel.test']);
    const pkg = await firstPackageId(dealer);
    const ok = await dealer.post('/api/jobs').send({ customer: { kind: 'existing', customerUserId: customers[0]!.id }, vehicle: { kind: 'new', vehicle: TEST_VEHICLE }, packageId: pkg, goals: 'x', cautionsAccepted: true });
    expect(ok.status).toBe(201);
    expect(ok.body.data.dealer.id).toBe(t.ids.kestrel.dealerId);
    const direct = await dealer.post('/api/jobs').send({ customer: { kind: 'existing', customerUserId: t.ids.kestrel.customerIds[0] }, vehicle: { kind: 'new', vehicle: TEST_VEHICLE }, packageId: pkg, goals: 'x', cautionsAccepted: true });
    expect(direct.status).toBe(400);
  });

  it('a wrong VIN check digit needs confirming; a malformed VIN is an error', async () => {
    const owner = await signIn(t.app, 'owner@kestrel.test');
    const pkg = await firstPackageId(owner);
    const body = (vin: string, vinCheckDigitOverride = false) => ({
      customer: { kind: 'existing', customerUserId: t.ids.kestrel.customerIds[0] },
      vehicle: { kind: 'new', vehicle: { ...TEST_VEHICLE, vin, vinCheckDigitOverride } },
      packageId: pkg,
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
    const job = kestrelJob((j) => j.state === 'ready');
    const tuner = await signIn(t.app, 'tuner2@kestrel.test');
    const before = (await tuner.get(`/api/jobs/${job.id}`)).body.data;
    expect(before.transitions.map((x: { to: string }) => x.to)).toContain('on_bench');
    const moved = await tuner.post(`/api/jobs/${job.id}/transitions`).send({ to: 'on_bench' });
    expect(moved.status).toBe(200);
    expect(moved.body.data).toMatchObject({ state: 'on_bench', tuner: { id: t.ids.kestrel.tunerIds[1] } });
    // Sending needs a revision on file (the vault's job): refused with a plain reason.
    const send = await tuner.post(`/api/jobs/${job.id}/transitions`).send({ to: 'with_customer' });
    expect(send.status).toBe(409);
    expect(send.body.error.code).toBe('invalid_transition');
    const detail = (await tuner.get(`/api/jobs/${job.id}`)).body.data;
    expect(detail.timeline.map((e: { text: string }) => e.text)).toContain('Moved from Ready to On the bench');
  });

  it('customers cannot make shop moves; another tuner’s job is invisible to a tuner', async () => {
    // The demo customer's jobs are with them and in log review; sending a job back to the bench is the shop's move.
    const customerJob = kestrelJob((j) => j.state === 'log_review' && j.customerUserId === t.ids.kestrel.customerIds[0]);
    const customer = await signIn(t.app, 'customer@kestrel.test');
    expect((await customer.post(`/api/jobs/${customerJob.id}/transitions`).send({ to: 'on_bench' })).status).toBe(403);

    const owner = await signIn(t.app, 'owner@kestrel.test');
    const onBench = (await owner.get(`/api/jobs?state=on_bench&tuner=${t.ids.kestrel.tunerIds[1]}`)).body.data[0];
    const tuner1 = await signIn(t.app, 'tuner@kestrel.test');
    expect((await tuner1.get(`/api/jobs/${onBench.id}`)).status).toBe(404);
    expect((await tuner1.post(`/api/jobs/${onBench.id}/transitions`).send({ to: 'on_hold' })).status).toBe(404);
  });

  it('two people moving the same job at once: one wins, the other is told', async () => {
    const job = kestrelJob((j) => j.state === 'ready');
    const owner = await signIn(t.app, 'owner@kestrel.test');
    const [a, b] = await Promise.all([
      owner.post(`/api/jobs/${job.id}/transitions`).send({ to: 'on_bench' }),
      owner.post(`/api/jobs/${job.id}/transitions`).send({ to: 'on_bench' }),
    ]);
    expect([a.status, b.status].sort()).toEqual([200, 409]);
  });

  it('the owner assigns; a tuner takes only unassigned jobs', async () => {
    const job = kestrelJob((j) => j.state === 'intake');
    const tuner = await signIn(t.app, 'tuner@kestrel.test');
    expect((await tuner.post(`/api/jobs/${job.id}/take`)).body.data.tuner.id).toBe(t.ids.kestrel.tunerIds[0]);
    const tuner2 = await signIn(t.app, 'tuner2@kestrel.test');
    expect((await tuner2.post(`/api/jobs/${job.id}/take`)).status).toBe(404);
    const owner = await signIn(t.app, 'owner@kestrel.test');
    const assigned = await owner.post(`/api/jobs/${job.id}/assign`).send({ tunerId: t.ids.kestrel.tunerIds[1] });
    expect(assigned.body.data.tuner.id).toBe(t.ids.kestrel.tunerIds[1]);
    expect((await tuner.post(`/api/jobs/${job.id}/assign`).send({ tunerId: null })).status).toBe(404);
    expect((await owner.post(`/api/jobs/${job.id}/assign`).send({ tunerId: t.ids.kestrel.customerIds[0] })).status).toBe(400);
  });
});

describe('messages', () => {
  it('a customer writes to the shop; the assigned tuner is notified by e-mail', async () => {
    const job = kestrelJob((j) => j.state === 'log_review' && j.customerUserId === t.ids.kestrel.customerIds[0]);
    const customer = await signIn(t.app, 'customer@kestrel.test');
    const posted = await customer.post(`/api/jobs/${job.id}/messages`).send({ body: 'Can you raise the rev limit a little?' });
    expect(posted.status).toBe(201);
    const thread = (await customer.get(`/api/jobs/${job.id}/messages`)).body.data;
    expect(thread.at(-1)).toMatchObject({ body: 'Can you raise the rev limit a little?', mine: true });
    const owner = await signIn(t.app, 'owner@kestrel.test');
    const detail = (await owner.get(`/api/jobs/${job.id}`)).body.data;
    const tunerEmail = detail.tuner.id === t.ids.kestrel.tunerIds[0] ? 'tuner@kestrel.test' : 'tuner2@kestrel.test';
    expect(t.mailbox.list().some((m) => m.to.includes(tunerEmail) && /Message from Jordan Hale/.test(m.subject))).toBe(true);
  });

  it('an e-mail preference turns the mail off but keeps the in-app notice', async () => {
    const job = kestrelJob((j) => j.state === 'log_review' && j.customerUserId === t.ids.kestrel.customerIds[0]);
    const customer = await signIn(t.app, 'customer@kestrel.test');
    expect((await customer.put('/api/notifications/preferences').send({ prefs: { message_received: { email: false } } })).status).toBe(200);
    const owner = await signIn(t.app, 'owner@kestrel.test');
    t.mailbox.clear();
    await owner.post(`/api/jobs/${job.id}/messages`).send({ body: 'Revision 1 comes tomorrow.' });
    expect(t.mailbox.list().some((m) => m.to.includes('customer@kestrel.test'))).toBe(false);
    expect((await customer.get('/api/notifications')).body.data[0].title).toMatch(/Message from Dana Whitfield/);
  });
});

describe('role × route matrix with another shop’s ids', () => {
  it('every job, vehicle and package route answers 404 for another shop’s ids', async () => {
    const harborJob = t.ids.jobs.find((j) => j.shopId === t.ids.harbor.shopId)!;
    const harborOwner = await signIn(t.app, 'owner@harbor.test');
    const harborVehicle = (await harborOwner.get('/api/vehicles')).body.data[0].id;
    const harborPackage = (await harborOwner.get('/api/packages')).body.data[0].id;
    for (const email of ['owner@kestrel.test', 'tuner@kestrel.test', 'dealer@kestrel.test', 'customer@kestrel.test']) {
      const agent = await signIn(t.app, email);
      const probes = await Promise.all([
        agent.get(`/api/jobs/${harborJob.id}`),
        agent.post(`/api/jobs/${harborJob.id}/transitions`).send({ to: 'cancelled' }),
        agent.post(`/api/jobs/${harborJob.id}/assign`).send({ tunerId: null }),
        agent.post(`/api/jobs/${harborJob.id}/take`),
        agent.put(`/api/jobs/${harborJob.id}/log-request`).send({ channels: ['rpm'], warmupMinutes: 5, wotGears: 1, notes: '' }),
        agent.get(`/api/jobs/${harborJob.id}/messages`),
        agent.post(`/api/jobs/${harborJob.id}/messages`).send({ body: 'hello' }),
        agent.get(`/api/vehicles/${harborVehicle}`),
        agent.put(`/api/vehicles/${harborVehicle}`).send(TEST_VEHICLE),
        agent.put(`/api/packages/${harborPackage}`).send({ name: 'x', modules: ['ECM'], retailPriceMinor: 1, dealerPriceMinor: 1, roundsIncluded: 1 }),
        agent.patch(`/api/packages/${harborPackage}`).send({ active: false }),
      ]);
      for (const res of probes) expect([email, res.status]).toEqual([email, 404]);
    }
    expect((await harborOwner.get(`/api/jobs/${harborJob.id}`)).status).toBe(200);
  });

  it('dealer and customer never see each other’s jobs inside one shop', async () => {
    const directJob = kestrelJob((j) => j.dealerId === null);
    const dealerJob = kestrelJob((j) => j.dealerId !== null);
    const dealer = await signIn(t.app, 'dealer@kestrel.test');
    expect((await dealer.get(`/api/jobs/${directJob.id}`)).status).toBe(404);
    expect((await dealer.get(`/api/jobs/${dealerJob.id}`)).status).toBe(200);
    const customer = await signIn(t.app, 'customer@kestrel.test');
    expect((await customer.get(`/api/jobs/${dealerJob.id}`)).status).toBe(404);
    expect((await customer.get(`/api/jobs/${dealerJob.id}/messages`)).status).toBe(404);
  });

  it('only owners manage packages and shop settings; customers do not see dealer prices', async () => {
    const pkgBody = { name: 'Economy', description: '', modules: ['ECM'], retailPriceMinor: 19900, dealerPriceMinor: 14900, roundsIncluded: 2 };
    const owner = await signIn(t.app, 'owner@kestrel.test');
    expect((await owner.post('/api/packages').send(pkgBody)).status).toBe(201);
    expect((await owner.post('/api/packages').send({ ...pkgBody, dealerPriceMinor: 29900 })).status).toBe(400);
    for (const email of ['tuner@kestrel.test', 'dealer@kestrel.test', 'customer@kestrel.test']) {
      const agent = await signIn(t.app, email);
      expect((await agent.post('/api/packages').send(pkgBody)).status).toBe(403);
      expect((await agent.patch('/api/shop').send({ settings: { holdUntilPaid: true } })).status).toBe(403);
    }
    const customer = await signIn(t.app, 'customer@kestrel.test');
    expect((await customer.get('/api/packages')).body.data[0].dealerPriceMinor).toBeNull();
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
    const customer = await signIn(t.app, 'customer@kestrel.test');
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
