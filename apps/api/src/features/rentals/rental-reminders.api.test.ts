import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { findShopById, updateShop } from '@revloop/db';
import { addDays, localDay } from '@revloop/domain/rentals';
import { createJob, createShop, type TestJob } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';
import { runRentalSweep } from './rental-notices';

let t: TestApp;
let job: TestJob;
type Agent = Awaited<ReturnType<typeof signIn>>;
let owner: Agent, customer: Agent;
const TZ = 'America/New_York';
const LIMIT = 2;

beforeAll(async () => {
  t = await createTestApp();
  const made = await createShop(t);
  const shop = (await findShopById(t.db, made.id))!;
  await updateShop(t.db, shop.id, { settings: JSON.stringify({ ...JSON.parse(shop.settings), timeZone: TZ, rentalOverdueReminderLimit: LIMIT }) });
  job = await createJob(t, made);
  owner = await signIn(t.app, made.owner.email);
  customer = await signIn(t.app, job.customer.email);
});
afterAll(() => t.close());

/** Sets the app's clock to an instant (the fake clock only moves by differences); sessions idle that long end, so sign in again. */
async function setNow(iso: string) {
  t.clock.advance(new Date(iso).getTime() - t.clock.now().getTime());
  owner = await signIn(t.app, job.shop.owner.email);
  customer = await signIn(t.app, job.customer.email);
}
const mails = (to: string, subject: RegExp) => t.mailbox.list().filter((m) => m.to.includes(to) && subject.test(m.subject));

describe('rental reminders and late days on the shop’s days', () => {
  it('sends each reminder once at the shop-local day boundary; overdue up to the limit; late days turn at local midnight', async () => {
    // A kit rented at no fee and no deposit ships without payments, so this test needs no payment stand-in.
    const kit = await owner.post('/api/kits').send({ name: 'Kit reminders', interfaceSerial: 'IF-2001', weeklyPriceMinor: 0, depositMinor: 0, lateFeePerDayMinor: 1500 });
    const today = localDay(t.clock.now(), TZ);
    const due = addDays(today, 10);
    const booked = await owner.post('/api/rentals').send({ jobId: job.id, kitId: kit.body.data.id, startDate: addDays(today, 3), dueDate: due });
    expect(booked.status).toBe(201);
    const id = booked.body.data.id as string;
    expect((await customer.post(`/api/rentals/${id}/terms`).send({ accept: true })).status).toBe(200);
    t.mailbox.clear();
    expect((await owner.post(`/api/rentals/${id}/transitions`).send({ to: 'shipped', carrier: 'UPS', trackingNumber: '1Z999' })).status).toBe(200);
    expect(mails(job.customer.email, /on its way/)).toHaveLength(1);

    // [STD] New York keeps EST (UTC−5) in winter months, so local midnight is 05:00Z. [CALC] due − 2 days turns at
    // 05:00Z of that day. The test dates are at least 10 days ahead of now (December to March): all EST.
    const at = (day: string, time: string) => `${day}T${time}Z`;
    const sweep = () => runRentalSweep(t.deps);
    await setNow(at(addDays(due, -2), '04:59:59'));
    await sweep();
    expect(mails(job.customer.email, /due back in 2 days/)).toHaveLength(0);
    await setNow(at(addDays(due, -2), '05:00:00'));
    await sweep();
    await sweep();
    expect(mails(job.customer.email, /due back in 2 days/)).toHaveLength(1);
    await setNow(at(due, '05:00:00'));
    await sweep();
    await sweep();
    expect(mails(job.customer.email, /due back today/)).toHaveLength(1);

    // Late days: none until New York midnight after the due day, then one more per local midnight.
    await setNow(at(addDays(due, 1), '04:59:59'));
    expect((await customer.get(`/api/rentals/${id}`)).body.data.lateDays).toBe(0);
    await setNow(at(addDays(due, 1), '05:00:00'));
    expect((await customer.get(`/api/rentals/${id}`)).body.data.lateDays).toBe(1);

    // Overdue: the customer is told daily up to the shop's limit (2), the owner every day.
    for (let day = 1; day <= 4; day += 1) {
      await setNow(at(addDays(due, day), '06:00:00'));
      await sweep();
      await sweep();
    }
    expect(mails(job.customer.email, /overdue/)).toHaveLength(LIMIT);
    expect(mails(job.shop.owner.email, new RegExp(`Overdue kit on job ${job.number}$`))).toHaveLength(4);
    const overview = await owner.get(`/api/kits/overview?from=${today}&to=${addDays(due, 4)}`);
    expect(overview.status).toBe(200);
    expect(overview.body.data.overdue.map((r: { id: string }) => r.id)).toContain(id);
    expect((await customer.get(`/api/kits/overview?from=${today}&to=${due}`)).status).toBe(403);

    // Returned 4 days late: [CALC] 4 × 15.00 = 60.00 late fee on close (no hold, no card: the owner waives it here).
    await setNow(at(addDays(due, 4), '12:00:00'));
    const returned = await owner.post(`/api/rentals/${id}/transitions`).send({ to: 'returned', receivedDate: addDays(due, 4), contents: [], condition: 'good' });
    expect(returned.body.data.lateDays).toBe(4);
    expect((await owner.post(`/api/rentals/${id}/transitions`).send({ to: 'closed' })).status).toBe(409);
    expect((await owner.post(`/api/rentals/${id}/transitions`).send({ to: 'closed', waiveLateFee: true })).status).toBe(200);
  });
});
