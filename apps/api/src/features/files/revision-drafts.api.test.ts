import { appendLedgerEntry, listQueuedMails } from '@revloop/db';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createCustomer, createJob, createMember, createPackage, createTwoShops, type TestMember } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';
import { fileLinkQuery } from './file-links';

// Issue 13 part 2: a revision upload is a draft the customer side never sees, by any route, until "Send revision"
// sends it with its "what changed" note; a shop may ask for a second person's approval first.

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(() => t.close());

type Agent = Awaited<ReturnType<typeof signIn>>;
const rawImage = (seed: number) => Buffer.from(Array.from({ length: 512 }, (_, i) => (i * 11 + seed) & 0xff));
const uploadRevision = (agent: Agent, jobId: string, module = 'ECM', seed = 5) =>
  agent.post(`/api/jobs/${jobId}/files`).field('module', module).field('kind', 'revision').attach('file', rawImage(seed), `${module}-draft.bin`);
const send = (agent: Agent, jobId: string, note?: string) => agent.post(`/api/jobs/${jobId}/transitions`).send({ to: 'with_customer', ...(note !== undefined && { note }) });

/** A dealer's customer's job on the bench with its tuner, so both the customer and the dealer are near it. */
async function benchJob(modules: Array<'ECM' | 'TCM'> = ['ECM']) {
  const two = await createTwoShops(t);
  const customer = await createCustomer(t, two.shop, { dealer: two.dealer });
  // A dealer's job is paid from its balance at intake.
  await appendLedgerEntry(t.db, { shopId: two.shop.id, dealerId: two.dealer.id, kind: 'top_up', amountMinor: 500_000, currency: 'USD', memo: 'Test top-up', at: t.clock.now().toISOString() });
  const pkg = await createPackage(t, two.shop, { modules });
  const job = await createJob(t, two.shop, { state: 'on_bench', tuner: two.people.tuner, customer, package: pkg });
  return { ...two, customer, job };
}

/** Everything the customer side could learn a file from, as one person sees it. */
async function customerSideView(agent: Agent, jobId: string, fileId: string) {
  const job = (await agent.get(`/api/jobs/${jobId}`)).body.data;
  const listed = (await agent.get('/api/jobs')).body.data.find((j: { id: string }) => j.id === jobId);
  return {
    listed: ((await agent.get(`/api/jobs/${jobId}/files`)).body.data as Array<{ id: string }>).some((f) => f.id === fileId),
    get: (await agent.get(`/api/files/${fileId}`)).status,
    download: (await agent.get(`/api/files/${fileId}/download`)).status,
    timeline: (job.timeline as Array<{ text: string }>).filter((e) => /Rev(ision)? 1\b/.test(e.text)).length,
    state: job.state,
    jobFacts: job.facts.hasRevisionForRound,
    listFacts: listed.facts.hasRevisionForRound,
    awaitingCount: listed.draftsAwaitingApproval,
    notices: (await agent.get('/api/notifications')).body.meta.total as number,
  };
}

describe('a revision upload is a draft', () => {
  it('the customer and the dealer see nothing of it by any route until it is sent with a note', async () => {
    const { shop, people, customer, job } = await benchJob();
    const customerAgent = await signIn(t.app, customer.email);
    const dealerAgent = await signIn(t.app, people.dealer.email);
    const noticesBefore = {
      customer: (await customerAgent.get('/api/notifications')).body.meta.total,
      dealer: (await dealerAgent.get('/api/notifications')).body.meta.total,
    };
    t.mailbox.clear();
    const tuner = await signIn(t.app, people.tuner.email);
    const uploaded = await uploadRevision(tuner, job.id);
    expect(uploaded.status).toBe(201);
    // Every module of the package is in, yet nothing moves: sending is its own step.
    expect(uploaded.body.meta).toMatchObject({ waitingFor: [], movedTo: null });
    expect(uploaded.body.data).toMatchObject({ draft: true, sendNote: null, sentAt: null });
    const fileId: string = uploaded.body.data.id;

    for (const [who, agent] of [['customer', customerAgent], ['dealer', dealerAgent]] as const) {
      expect({ who, ...(await customerSideView(agent, job.id, fileId)) }).toEqual({
        who,
        listed: false,
        get: 404,
        download: 404,
        timeline: 0,
        state: 'on_bench',
        jobFacts: false,
        listFacts: false,
        awaitingCount: 0,
        notices: noticesBefore[who],
      });
      expect((await agent.get(`/api/files/${fileId}/diff/${fileId}`)).status).toBe(404);
    }
    // An e-mailed link, even a validly signed one, opens no draft.
    const link = `/api/files/${fileId}/download?${fileLinkQuery(t.deps.env.FILE_LINK_SECRET, shop.id, fileId, t.clock.now())}`;
    expect((await (await signIn(t.app, people.tuner.email)).get(link)).status).toBe(404);
    expect(t.mailbox.list().filter((m) => m.to.includes(customer.email) || m.to.includes(people.dealer.email))).toEqual([]);
    expect(await listQueuedMails(t.db, 100)).toEqual([]);
    // The shop side sees the draft.
    const staffFiles = (await tuner.get(`/api/jobs/${job.id}/files`)).body.data as Array<{ id: string; draft: boolean }>;
    expect(staffFiles.find((f) => f.id === fileId)).toMatchObject({ draft: true });
    expect((await tuner.get(`/api/jobs/${job.id}`)).body.data.facts.hasRevisionForRound).toBe(true);

    const note = 'Added a little fuel at full throttle above 4,500 rpm.';
    const sent = await send(tuner, job.id, `  ${note}  `);
    expect(sent.status).toBe(200);
    expect(sent.body.data).toMatchObject({ state: 'with_customer', round: 1 });
    for (const agent of [customerAgent, dealerAgent]) {
      const view = await customerSideView(agent, job.id, fileId);
      expect(view).toMatchObject({ listed: true, get: 200, download: 200, state: 'with_customer' });
      expect((await agent.get(`/api/files/${fileId}`)).body.data).toMatchObject({ draft: false, sendNote: note });
      const timeline = (await agent.get(`/api/jobs/${job.id}`)).body.data.timeline as Array<{ text: string }>;
      expect(timeline.some((e) => e.text.includes(`what changed: ${note}`))).toBe(true);
    }
    expect((await customerAgent.get(link)).status).toBe(200);
    const mail = t.mailbox.list().find((m) => m.to.includes(customer.email));
    expect(mail?.text).toContain(note);
    expect(mail?.text).toContain(`/api/files/${fileId}/download?`);
    const notice = (await customerAgent.get('/api/notifications')).body.data[0];
    expect(notice.body).toContain(note);
  });

  it('Send revision needs every module, and a note: required, trimmed, at most 2000 characters', async () => {
    const { people, job } = await benchJob(['ECM', 'TCM']);
    const tuner = await signIn(t.app, people.tuner.email);
    expect((await uploadRevision(tuner, job.id, 'ECM')).body.meta.waitingFor).toEqual(['TCM']);
    expect(await send(tuner, job.id, 'ECM only')).toMatchObject({ status: 409, body: { error: { code: 'invalid_transition' } } });
    expect((await tuner.get(`/api/jobs/${job.id}`)).body.data.transitions.some((m: { to: string }) => m.to === 'with_customer')).toBe(false);
    expect((await uploadRevision(tuner, job.id, 'TCM', 9)).status).toBe(201);
    const offered = (await tuner.get(`/api/jobs/${job.id}`)).body.data.transitions;
    expect(offered).toContainEqual({ to: 'with_customer', label: 'Send revision', needsNote: true });
    for (const note of [undefined, '', '   ', 'x'.repeat(2001)]) {
      expect((await send(tuner, job.id, note)).body.error?.code, JSON.stringify(note?.slice(0, 5))).toBe('validation');
    }
    expect((await tuner.get(`/api/jobs/${job.id}`)).body.data.state).toBe('on_bench');
    expect((await send(tuner, job.id, 'x'.repeat(2000))).status).toBe(200);
  });
});

describe('second-person approval', () => {
  async function approvalShop() {
    const setup = await benchJob();
    const owner = await signIn(t.app, setup.shop.owner.email);
    expect((await (await signIn(t.app, setup.people.tuner.email)).patch('/api/shop').send({ revisionApproval: true })).status).toBe(403);
    const patched = await owner.patch('/api/shop').send({ revisionApproval: true });
    expect(patched.status).toBe(200);
    expect((await owner.get('/api/shop')).body.data.revisionApproval).toBe(true);
    const secondTuner: TestMember = await createMember(t, setup.shop, 'tuner');
    return { ...setup, owner, secondTuner };
  }

  it('asks for approval when the shop says so; the uploader cannot give it; another tuner can; staff see it on the timeline', async () => {
    const { people, customer, job, owner, secondTuner, other } = await approvalShop();
    const uploader = await signIn(t.app, people.tuner.email);
    const draft = (await uploadRevision(uploader, job.id)).body.data;
    expect(draft).toMatchObject({ draft: true, approvalRequired: true, approvedBy: null, canApprove: false });
    const refused = await send(uploader, job.id, 'Fuel at full throttle');
    expect(refused.status).toBe(409);
    expect(refused.body.error.message).toMatch(/approval/);

    // The board finds it, for staff only.
    const waiting = (await owner.get('/api/jobs?awaiting=approval')).body.data as Array<{ id: string; draftsAwaitingApproval: number }>;
    expect(waiting.map((j) => [j.id, j.draftsAwaitingApproval])).toEqual([[job.id, 1]]);
    const customerAgent = await signIn(t.app, customer.email);
    expect((await customerAgent.get('/api/jobs?awaiting=approval')).body.data.map((j: { draftsAwaitingApproval: number }) => j.draftsAwaitingApproval)).toEqual([0]);

    // The uploader may not approve their own draft; the customer side cannot even see it; another shop gets a 404.
    expect((await uploader.post(`/api/files/${draft.id}/approve`)).status).toBe(403);
    expect((await customerAgent.post(`/api/files/${draft.id}/approve`)).status).toBe(404);
    expect((await (await signIn(t.app, people.dealer.email)).post(`/api/files/${draft.id}/approve`)).status).toBe(404);
    expect((await (await signIn(t.app, other.owner.email)).post(`/api/files/${draft.id}/approve`)).status).toBe(404);

    // A second tuner, not on the job, opens it from the board and approves.
    const reviewer = await signIn(t.app, secondTuner.email);
    expect((await reviewer.get(`/api/jobs/${job.id}`)).status).toBe(200);
    const seen = (await reviewer.get(`/api/jobs/${job.id}/files`)).body.data.find((f: { id: string }) => f.id === draft.id);
    expect(seen).toMatchObject({ canApprove: true });
    expect((await reviewer.get(`/api/jobs/${job.id}`)).body.data.transitions).toEqual([]);
    const approved = await reviewer.post(`/api/files/${draft.id}/approve`);
    expect(approved.status).toBe(200);
    expect(approved.body.data).toMatchObject({ approvedBy: { id: secondTuner.id }, canApprove: false });
    expect((await owner.post(`/api/files/${draft.id}/approve`)).status).toBe(409);
    expect((await owner.get('/api/jobs?awaiting=approval')).body.data).toEqual([]);
    // With nothing left to approve the job leaves the second tuner's reach again.
    expect((await reviewer.get(`/api/jobs/${job.id}`)).status).toBe(404);
    expect((await reviewer.post(`/api/files/${draft.id}/approve`)).status).toBe(404);

    expect((await send(uploader, job.id, 'Fuel at full throttle')).status).toBe(200);
    const staffTimeline = (await owner.get(`/api/jobs/${job.id}`)).body.data.timeline as Array<{ action: string; actor: string; text: string }>;
    expect(staffTimeline.find((e) => e.action === 'revision.approved')).toMatchObject({ actor: secondTuner.name, text: 'Rev 1 (ECM) approved' });
    const customerTimeline = (await customerAgent.get(`/api/jobs/${job.id}`)).body.data.timeline as Array<{ action: string }>;
    expect(customerTimeline.some((e) => e.action === 'revision.approved')).toBe(false);
    expect((await customerAgent.get(`/api/files/${draft.id}`)).body.data).toMatchObject({ sendNote: 'Fuel at full throttle' });
  });

  it('the owner approves a tuner’s draft; a draft made before the setting was on needs none', async () => {
    const { people, job, owner } = await approvalShop();
    const uploader = await signIn(t.app, people.tuner.email);
    const draft = (await uploadRevision(uploader, job.id)).body.data;
    expect((await owner.post(`/api/files/${draft.id}/approve`)).status).toBe(200);
    expect((await send(uploader, job.id, 'Timing near peak torque')).status).toBe(200);

    const setup = await benchJob();
    const tuner = await signIn(t.app, setup.people.tuner.email);
    const before = (await uploadRevision(tuner, setup.job.id)).body.data;
    expect((await (await signIn(t.app, setup.shop.owner.email)).patch('/api/shop').send({ revisionApproval: true })).status).toBe(200);
    expect(before).toMatchObject({ approvalRequired: false });
    expect((await send(tuner, setup.job.id, 'First revision')).status).toBe(200);
  });

  it('the owner cannot approve a draft they uploaded themselves', async () => {
    const { shop, job, owner } = await approvalShop();
    expect((await owner.post(`/api/jobs/${job.id}/assign`).send({ tunerId: null })).status).toBe(200);
    const draft = (await uploadRevision(owner, job.id)).body.data;
    expect(draft.uploadedBy.id).toBe(shop.owner.id);
    expect((await owner.post(`/api/files/${draft.id}/approve`)).status).toBe(403);
  });
});
