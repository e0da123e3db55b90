import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { addDays, localDay } from '@revloop/domain/rentals';
import { createCustomer, createJob, createLedgerEntry, createPackage, createTwoShops, createVehicle, type TestMember, type TestShop } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';

// A kit asked for when the job opens (customer and dealer), and the owner's export of every rental money line.

let t: TestApp;
type Agent = Awaited<ReturnType<typeof signIn>>;
let shop: TestShop;
let owner: Agent, tuner: Agent, customer: Agent, dealer: Agent, otherOwner: Agent;
let people: { customer: TestMember; dealer: TestMember };
let dealersCustomer: TestMember;

beforeAll(async () => {
  t = await createTestApp({}, { stripe: true });
  const two = await createTwoShops(t);
  shop = two.shop;
  people = two.people;
  dealersCustomer = await createCustomer(t, shop, { dealer: two.dealer });
  // The dealer's jobs are paid from its prepaid balance.
  await createLedgerEntry(t, two.dealer, { amountMinor: 1_000_000 });
  owner = await signIn(t.app, shop.owner.email);
  tuner = await signIn(t.app, two.people.tuner.email);
  customer = await signIn(t.app, two.people.customer.email);
  dealer = await signIn(t.app, two.people.dealer.email);
  otherOwner = await signIn(t.app, two.other.owner.email);
});
afterAll(() => t.close());

const today = () => localDay(t.clock.now(), 'UTC');

async function intake(who: TestMember) {
  const vehicle = await createVehicle(t, who);
  const pkg = await createPackage(t, shop);
  return { customer: { kind: 'existing', customerUserId: who.id }, vehicle: { kind: 'existing', vehicleId: vehicle.id }, packageId: pkg.id, goals: 'Smoother part throttle.', cautionsAccepted: true };
}

describe('a kit asked for at intake', () => {
  it('a customer opens a job with "I need a flashing kit": the job and the requested rental arrive together', async () => {
    const kitRequest = { startDate: addDays(today(), 10), dueDate: addDays(today(), 23), notes: 'No laptop here.' };
    const res = await customer.post('/api/jobs').send({ ...(await intake(people.customer)), kitRequest });
    expect(res.status).toBe(201);
    const jobId = res.body.data.id as string;
    const rentals = await customer.get(`/api/rentals?jobId=${jobId}`);
    expect(rentals.body.data).toEqual([expect.objectContaining({ jobId, kitId: null, state: 'requested', startDate: kitRequest.startDate, dueDate: kitRequest.dueDate })]);
    const detail = await owner.get(`/api/rentals/${rentals.body.data[0].id}`);
    expect(detail.body.data).toMatchObject({ notes: 'No laptop here.', nextStep: 'Pick a kit and dates to book this request.' });
    // The move is on the job's timeline.
    const job = await owner.get(`/api/jobs/${jobId}`);
    expect(JSON.stringify(job.body.data.timeline)).toContain('Kit asked for');
  });

  it("a dealer asks for a kit for one of its customers' jobs", async () => {
    const kitRequest = { startDate: addDays(today(), 40), dueDate: addDays(today(), 47) };
    const res = await dealer.post('/api/jobs').send({ ...(await intake(dealersCustomer)), kitRequest });
    expect(res.status).toBe(201);
    const rentals = await dealer.get(`/api/rentals?jobId=${res.body.data.id}`);
    expect(rentals.body.data).toEqual([expect.objectContaining({ state: 'requested', kitId: null })]);
  });

  it('a bad kit request is refused and opens no job either', async () => {
    const before = (await owner.get('/api/jobs?pageSize=100')).body.meta.total as number;
    const res = await customer.post('/api/jobs').send({ ...(await intake(people.customer)), kitRequest: { startDate: addDays(today(), 9), dueDate: addDays(today(), 2) } });
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body)).toContain('The due date is before the start date.');
    expect((await owner.get('/api/jobs?pageSize=100')).body.meta.total).toBe(before);
  });
});

describe('GET /api/rentals/money.csv', () => {
  it('lists every money line of the range for the owner, with the customer-facing reason; others are refused', async () => {
    const kit = await owner.post('/api/kits').send({ name: 'Kit export', interfaceSerial: 'IF-EXP-1', weeklyPriceMinor: 12000, depositMinor: 50000, lateFeePerDayMinor: 1500 });
    expect(kit.status).toBe(201);
    const job = await createJob(t, shop, { customer: people.customer });
    const booked = await owner.post('/api/rentals').send({ jobId: job.id, kitId: kit.body.data.id, startDate: addDays(today(), 3), dueDate: addDays(today(), 9) });
    expect(booked.status).toBe(201);
    const id = booked.body.data.id as string;
    expect((await customer.post(`/api/rentals/${id}/terms`).send({ accept: true })).status).toBe(200);
    const { origin, pathname } = new URL((await customer.post(`/api/rentals/${id}/fee/checkout`)).body.data.url);
    await request(origin).post(pathname).type('form').send({ card: '4242 4242 4242 4242', action: 'pay' });
    await t.stripe!.control.settle();

    const range = `from=${addDays(today(), -1)}&to=${addDays(today(), 1)}`;
    const res = await owner.get(`/api/rentals/money.csv?${range}`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toContain('text/csv');
    expect(res.headers['content-disposition']).toContain('attachment');
    const lines = res.text.trim().split('\r\n');
    expect(lines[0]).toBe('Day,Time (UTC),Job,Customer,Kit,Line,Description,Amount,Currency,Rental');
    // One week at 120.00 a week (fee = whole weeks rounded up × weekly price: the rule of this feature).
    expect(lines.find((l) => l.includes(id) && l.includes('Rental fee paid'))).toContain('120.00,USD');

    // Outside the range: nothing but the header.
    const later = await owner.get(`/api/rentals/money.csv?from=${addDays(today(), 30)}&to=${addDays(today(), 31)}`);
    expect(later.text.trim().split('\r\n')).toHaveLength(1);
    // Another shop's owner sees none of these lines; staff other than the owner and customers are refused.
    expect((await otherOwner.get(`/api/rentals/money.csv?${range}`)).text).not.toContain(id);
    expect((await tuner.get(`/api/rentals/money.csv?${range}`)).status).toBe(403);
    expect((await customer.get(`/api/rentals/money.csv?${range}`)).status).toBe(403);
    expect((await owner.get(`/api/rentals/money.csv?from=${today()}&to=${addDays(today(), -3)}`)).status).toBe(400);
  });
});
