import request from 'supertest';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createCustomer, createJob, createLedgerEntry, createTwoShops, payJob, type TestJob } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';
import { fileLinkQuery } from '../files/file-links';

// Issue 13 part 3, paid before download: a retail customer's sent revision stays locked (402 payment_required) until
// the job is paid or the owner waives the lock; reads, re-reads and logs never are, nor are dealer jobs.

let t: TestApp;
let two: Awaited<ReturnType<typeof createTwoShops>>;
beforeAll(async () => {
  t = await createTestApp({}, { stripe: true });
  two = await createTwoShops(t);
  await createLedgerEntry(t, two.dealer);
});
afterAll(() => t.close());

type Agent = Awaited<ReturnType<typeof signIn>>;

/** A retail job whose first revision was sent: its customer is waiting to download it. */
const retailJob = async (state: 'with_customer' | 'log_review' = 'with_customer') => createJob(t, two.shop, { state, customer: await createCustomer(t, two.shop) });

async function filesOf(agent: Agent, jobId: string) {
  const res = await agent.get(`/api/jobs/${jobId}/files`);
  expect(res.status).toBe(200);
  return res.body.data as Array<{ id: string; kind: string; sendNote: string | null; lock: { locked: boolean; reason: string; message: string; dueMinor: number } }>;
}
const revisionOf = async (agent: Agent, job: TestJob) => (await filesOf(agent, job.id)).find((f) => f.kind === 'revision')!;
const linkTo = (fileId: string) => `/api/files/${fileId}/download?${fileLinkQuery(t.deps.env.FILE_LINK_SECRET, two.shop.id, fileId, t.clock.now())}`;

describe('paid before download', () => {
  it('GET /api/shop has the setting, on by default', async () => {
    const owner = await signIn(t.app, two.shop.owner.email);
    expect((await owner.get('/api/shop')).body.data.paidBeforeDownload).toBe(true);
  });

  it('locks an unpaid retail job’s sent revision: the customer sees it and its note, download and signed link answer 402', async () => {
    const job = await retailJob();
    const customer = await signIn(t.app, job.customer.email);
    const revision = await revisionOf(customer, job);
    expect(revision.sendNote).toMatch(/^Revision 1:/);
    expect(revision.lock).toMatchObject({ locked: true, reason: 'unpaid', dueMinor: job.package.retailPriceMinor });
    const download = await customer.get(`/api/files/${revision.id}/download`);
    expect(download.status).toBe(402);
    expect(download.body.error).toMatchObject({ code: 'payment_required' });
    expect(download.body.error.message).toMatch(/unlocks when the job is paid/);
    expect((await request(t.app).get(linkTo(revision.id))).status).toBe(402);
    // The revision-ready e-mail says so before its links are clicked.
    const mail = t.mailbox.list().find((m) => m.to.includes(job.customer.email) && /Revision 1 is ready/.test(m.subject));
    expect(mail?.text).toMatch(/unlocks when the job is paid/);
    // The bytes do not leak through the hex view either.
    const read = (await filesOf(customer, job.id)).find((f) => f.kind === 'read')!;
    expect((await customer.get(`/api/files/${read.id}/diff/${revision.id}/hex?range=0x0-0x10`)).status).toBe(402);
    // Nothing was recorded as downloaded.
    const downloads = await t.db.selectFrom('audit_events').select('id').where('subject_id', '=', job.id).where('action', '=', 'file.downloaded').execute();
    expect(downloads).toEqual([]);
    // The job's payments say the same, and the customer may pay.
    const payments = (await customer.get(`/api/billing/jobs/${job.id}/payments`)).body.data;
    expect(payments).toMatchObject({ canPay: true, downloadLock: { locked: true, reason: 'unpaid', canWaive: false } });
  });

  it('never locks reads, re-reads or logs, and never the bench', async () => {
    const job = await retailJob('log_review');
    const customer = await signIn(t.app, job.customer.email);
    const files = await filesOf(customer, job.id);
    const read = files.find((f) => f.kind === 'read')!;
    expect(read.lock).toMatchObject({ locked: false, reason: 'not_a_revision' });
    expect((await customer.get(`/api/files/${read.id}/download`)).status).toBe(200);
    expect((await request(t.app).get(linkTo(read.id))).status).toBe(200);
    const reRead = await customer.post(`/api/jobs/${job.id}/files`).field('module', 'ECM').field('kind', 're_read').attach('file', Buffer.from(Array.from({ length: 512 }, (_, i) => (i * 13 + 5) & 0xff)), 'ECM-re-read.bin');
    expect(reRead.status).toBe(201);
    expect(reRead.body.data.lock).toMatchObject({ locked: false });
    expect((await customer.get(`/api/files/${reRead.body.data.id}/download`)).status).toBe(200);
    const logs = (await customer.get(`/api/jobs/${job.id}/datalogs`)).body.data as Array<{ id: string }>;
    expect(logs.length).toBeGreaterThan(0);
    expect((await customer.get(`/api/datalogs/${logs[0]!.id}`)).status).toBe(200);
    // The owner downloads the revision the customer waits for.
    const owner = await signIn(t.app, two.shop.owner.email);
    const revision = await revisionOf(owner, job);
    expect(revision.lock).toMatchObject({ locked: false, reason: 'shop_staff' });
    expect((await owner.get(`/api/files/${revision.id}/download`)).status).toBe(200);
    expect((await revisionOf(customer, job)).lock.locked).toBe(true);
  });

  it('opens once the job is paid', async () => {
    const job = await retailJob();
    await payJob(t, job);
    const customer = await signIn(t.app, job.customer.email);
    const revision = await revisionOf(customer, job);
    expect(revision.lock).toMatchObject({ locked: false, reason: 'paid' });
    expect((await customer.get(`/api/files/${revision.id}/download`)).status).toBe(200);
    expect((await request(t.app).get(linkTo(revision.id))).status).toBe(200);
  });

  it('tells the customer to pay first in the job’s next step, on the job and in their list, until it is paid', async () => {
    const job = await retailJob();
    const customer = await signIn(t.app, job.customer.email);
    const listed = async () => ((await customer.get('/api/jobs?pageSize=100')).body.data as Array<{ id: string; nextStep: string; nextStepAction: string | null }>).find((j) => j.id === job.id)!;
    const payFirst = { nextStep: 'Pay for this job to unlock revision 1, then flash it, warm up and log as requested.', nextStepAction: 'pay' };
    expect((await customer.get(`/api/jobs/${job.id}`)).body.data).toMatchObject(payFirst);
    expect(await listed()).toMatchObject(payFirst);
    // The in-app notice of the sent revision says the same.
    const notices = (await customer.get('/api/notifications')).body.data as Array<{ title: string; body: string }>;
    expect(notices.find((n) => n.title.startsWith(`Revision 1 is ready — Job ${job.number} `))?.body).toMatch(/ Pay for this job to unlock revision 1, then flash it, warm up and log as requested\.$/);
    // The bench is never locked out: its next step is its own.
    const owner = await signIn(t.app, two.shop.owner.email);
    expect((await owner.get(`/api/jobs/${job.id}`)).body.data).toMatchObject({ nextStep: 'Waiting for the customer to flash revision 1 and send a log.', nextStepAction: null });
    // A payment is not a write to the job, yet the customer's list (cached per viewer) answers anew.
    await payJob(t, job);
    const flash = { nextStep: 'Flash revision 1, warm up, then log as requested.', nextStepAction: null };
    expect(await listed()).toMatchObject(flash);
    expect((await customer.get(`/api/jobs/${job.id}`)).body.data).toMatchObject(flash);
  });

  it('opens when payment lands through Checkout and its webhook', async () => {
    const job = await retailJob();
    const customer = await signIn(t.app, job.customer.email);
    const revision = await revisionOf(customer, job);
    expect((await customer.get(`/api/files/${revision.id}/download`)).status).toBe(402);
    const started = await customer.post('/api/billing/checkout').send({ purpose: 'job', jobId: job.id });
    expect(started.status).toBe(200);
    const { origin, pathname } = new URL(started.body.url);
    expect((await request(origin).post(pathname).type('form').send({ card: '4242 4242 4242 4242', action: 'pay' })).status).toBe(303);
    await t.stripe!.control.settle();
    expect((await revisionOf(customer, job)).lock.locked).toBe(false);
    expect((await customer.get(`/api/files/${revision.id}/download`)).status).toBe(200);
  });

  it('never locks a dealer’s job (paid from the dealer balance at intake)', async () => {
    const customer = await createCustomer(t, two.shop, { dealer: two.dealer });
    const job = await createJob(t, two.shop, { state: 'with_customer', customer });
    const mail = t.mailbox.list().find((m) => m.to.includes(customer.email) && /Revision 1 is ready/.test(m.subject));
    expect(mail?.text).toMatch(/Download \(each link/);
    expect(mail?.text).not.toMatch(/unlocks when the job is paid/);
    for (const email of [customer.email, two.people.dealer.email]) {
      const agent = await signIn(t.app, email);
      const revision = await revisionOf(agent, job);
      expect(revision.lock).toMatchObject({ locked: false, reason: 'dealer_job' });
      expect((await agent.get(`/api/files/${revision.id}/download`)).status).toBe(200);
    }
    const owner = await signIn(t.app, two.shop.owner.email);
    expect((await owner.post(`/api/billing/jobs/${job.id}/payment-lock/waive`)).status).toBe(409);
  });

  it('only the owner waives it, once, on the job’s timeline; then the customer downloads', async () => {
    const job = await retailJob();
    const customer = await signIn(t.app, job.customer.email);
    const tuner = await signIn(t.app, two.people.tuner.email);
    const revision = await revisionOf(customer, job);
    expect((await customer.post(`/api/billing/jobs/${job.id}/payment-lock/waive`)).status).toBe(403);
    expect((await tuner.post(`/api/billing/jobs/${job.id}/payment-lock/waive`)).status).toBe(403);
    expect((await customer.get(`/api/files/${revision.id}/download`)).status).toBe(402);

    const owner = await signIn(t.app, two.shop.owner.email);
    expect((await owner.get(`/api/billing/jobs/${job.id}/payments`)).body.data.downloadLock).toMatchObject({ locked: true, canWaive: true });
    const waived = await owner.post(`/api/billing/jobs/${job.id}/payment-lock/waive`);
    expect(waived.status).toBe(200);
    expect(waived.body.data.downloadLock).toMatchObject({ locked: false, reason: 'waived', canWaive: false, waivedBy: { id: two.shop.owner.id } });
    expect((await owner.post(`/api/billing/jobs/${job.id}/payment-lock/waive`)).status).toBe(409);

    expect((await revisionOf(customer, job)).lock).toMatchObject({ locked: false, reason: 'waived' });
    expect((await customer.get(`/api/files/${revision.id}/download`)).status).toBe(200);
    expect((await request(t.app).get(linkTo(revision.id))).status).toBe(200);
    const timeline = (await customer.get(`/api/jobs/${job.id}`)).body.data.timeline as Array<{ text: string }>;
    expect(timeline.some((e) => /^Payment before download waived/.test(e.text))).toBe(true);
  });

  it('another shop’s owner cannot waive it or see the job (404)', async () => {
    const job = await retailJob();
    const stranger = await signIn(t.app, two.other.owner.email);
    expect((await stranger.post(`/api/billing/jobs/${job.id}/payment-lock/waive`)).status).toBe(404);
    const revision = await revisionOf(await signIn(t.app, job.customer.email), job);
    expect((await stranger.get(`/api/files/${revision.id}/download`)).status).toBe(404);
  });

  it('with the setting off, nothing is locked', async () => {
    const job = await retailJob();
    const owner = await signIn(t.app, two.shop.owner.email);
    const off = await owner.patch('/api/shop').send({ paidBeforeDownload: false });
    expect(off.status).toBe(200);
    expect(off.body.data.paidBeforeDownload).toBe(false);
    try {
      const customer = await signIn(t.app, job.customer.email);
      const revision = await revisionOf(customer, job);
      expect(revision.lock).toMatchObject({ locked: false, reason: 'setting_off' });
      expect((await customer.get(`/api/files/${revision.id}/download`)).status).toBe(200);
      expect((await customer.get(`/api/billing/jobs/${job.id}/payments`)).body.data.downloadLock).toMatchObject({ locked: false, reason: 'setting_off' });
      // Only the owner changes it.
      expect((await (await signIn(t.app, two.people.tuner.email)).patch('/api/shop').send({ paidBeforeDownload: true })).status).toBe(403);
    } finally {
      expect((await owner.patch('/api/shop').send({ paidBeforeDownload: true })).status).toBe(200);
    }
  });
});
