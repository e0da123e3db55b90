import { findJob, inTransaction, listAuditEvents, listQueuedMails } from '@revloop/db';
import { SYSTEM_ACTOR_NAME, defineAbilityFor, systemActorFor } from '@revloop/domain/auth';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createDemoTestApp } from '../../testing/demo-fixture';
import { signIn } from '../../testing/test-app';
import { drainMailOutbox } from '../mail/mail-outbox.service';
import { transitionJob } from './job-workflow.service';

// One writer of job state: the move, its audit event, its in-app notices and its queued e-mail commit or roll
// back together, and mail goes out only after the commit.

let t: Awaited<ReturnType<typeof createDemoTestApp>>;
beforeEach(async () => {
  t = await createDemoTestApp();
});
afterEach(async () => {
  await t.close();
});

const seededJob = (state: string) => {
  const job = t.ids.jobs.find((j) => j.shopId === t.ids.kestrel.shopId && j.state === state && j.dealerId === null);
  if (!job) throw new Error(`no seeded ${state} job`);
  return job;
};
const owner = () => {
  const actor = { userId: t.ids.kestrel.ownerId, platformAdmin: false, shopId: t.ids.kestrel.shopId, role: 'owner' as const, dealerId: null, shopReadOnly: false };
  return { actor, ability: defineAbilityFor(actor), causedBy: actor.userId };
};
const counts = async (jobId: string) => ({
  events: (await listAuditEvents(t.db, t.ids.kestrel.shopId, { subjectType: 'Job', subjectId: jobId, limit: 500 })).length,
  notices: (await t.db.selectFrom('notifications').select('id').where('job_id', '=', jobId).execute()).length,
  queued: (await listQueuedMails(t.db, 1000)).length,
});

describe('the job workflow', () => {
  it('a move rolled back with its transaction leaves no state, audit event, notice or e-mail behind', async () => {
    const job = seededJob('log_review');
    const before = await counts(job.id);
    t.mailbox.clear();
    await expect(
      inTransaction(t.db, async (trx) => {
        const row = (await findJob(trx, job.shopId, job.id))!;
        await transitionJob(t.deps, trx, row, 'dialed_in', owner());
        throw new Error('a later step of the same change failed');
      }),
    ).rejects.toThrow('a later step');
    await drainMailOutbox(t.deps);
    expect((await findJob(t.db, job.shopId, job.id))!.state).toBe('log_review');
    expect(await counts(job.id)).toEqual(before);
    expect(t.mailbox.list()).toEqual([]);
  });

  it('a committed move writes its audit event and notices, and its e-mail survives a mail server that is down', async () => {
    const job = seededJob('log_review');
    const before = await counts(job.id);
    const send = t.deps.mailer.send;
    t.deps.mailer.send = () => Promise.reject(new Error('mail server down'));
    try {
      const owning = await signIn(t.app, 'owner@kestrel.test');
      const moved = await owning.post(`/api/jobs/${job.id}/transitions`).send({ to: 'dialed_in' });
      expect(moved.status).toBe(200);
      expect(moved.body.data.state).toBe('dialed_in');
    } finally {
      t.deps.mailer.send = send;
    }
    const after = await counts(job.id);
    expect(after.events).toBe(before.events + 1);
    expect(after.notices).toBeGreaterThan(before.notices);
    const queued = await listQueuedMails(t.db, 1000);
    expect(queued.length).toBeGreaterThan(0);
    expect(queued.every((m) => m.attempts === 1 && m.last_error === 'mail server down')).toBe(true);
    t.mailbox.clear();
    await drainMailOutbox(t.deps);
    expect(await listQueuedMails(t.db, 1000)).toEqual([]);
    const customerEmail = (await t.db.selectFrom('users').select('email').where('id', '=', job.customerUserId).executeTakeFirstOrThrow()).email;
    expect(t.mailbox.list().some((m) => m.to.includes(customerEmail) && /Dialed in/.test(m.subject))).toBe(true);
  });

  it('the system actor makes automatic moves under its own rules and shows as Revloop on the timeline', async () => {
    const job = seededJob('with_customer');
    const system = { actor: systemActorFor(job.shopId), causedBy: null };
    // Finishing a job is a person's call: the system actor may not.
    await expect(
      inTransaction(t.db, async (trx) => transitionJob(t.deps, trx, (await findJob(trx, job.shopId, job.id))!, 'cancelled', system)),
    ).rejects.toMatchObject({ code: 'forbidden' });
    await t.db.updateTable('jobs').set({ has_log_for_round: 1 }).where('id', '=', job.id).execute();
    await inTransaction(t.db, async (trx) => transitionJob(t.deps, trx, (await findJob(trx, job.shopId, job.id))!, 'log_review', system));
    const events = await listAuditEvents(t.db, job.shopId, { subjectType: 'Job', subjectId: job.id, limit: 500 });
    const event = events.find((e) => e.action === 'job.moved' && (JSON.parse(e.details) as { to?: string }).to === 'log_review');
    expect(event).toMatchObject({ actor_user_id: null, details: expect.stringContaining('"automatic":true') });
    const owning = await signIn(t.app, 'owner@kestrel.test');
    const timeline = (await owning.get(`/api/jobs/${job.id}`)).body.data.timeline as Array<{ action: string; actor: string | null; text: string }>;
    expect(timeline.find((e) => e.text === 'Moved from With customer to Log review')).toMatchObject({ action: 'job.moved', actor: SYSTEM_ACTOR_NAME });
  });

  it('the buttons a job shows are the moves the server accepts, for each role', async () => {
    const job = seededJob('with_customer');
    await t.db.updateTable('jobs').set({ has_log_for_round: 1 }).where('id', '=', job.id).execute();
    const customerEmail = (await t.db.selectFrom('users').select('email').where('id', '=', job.customerUserId).executeTakeFirstOrThrow()).email;
    for (const email of ['owner@kestrel.test', customerEmail, 'dealer@kestrel.test']) {
      const agent = await signIn(t.app, email);
      const shown = await agent.get(`/api/jobs/${job.id}`);
      // The dealer does not see a job of a customer without a dealer at all.
      if (shown.status === 404) continue;
      const offered = (shown.body.data.transitions as Array<{ to: string }>).map((x) => x.to);
      for (const to of ['ready', 'on_bench', 'log_review', 'dialed_in', 'on_hold', 'cancelled']) {
        const probe = await createDemoTestApp();
        try {
          const again = await signIn(probe.app, email);
          await probe.db.updateTable('jobs').set({ has_log_for_round: 1 }).where('id', '=', job.id).execute();
          const res = await again.post(`/api/jobs/${job.id}/transitions`).send({ to });
          expect(res.status === 200, `${email} → ${to}`).toBe(offered.includes(to));
        } finally {
          await probe.close();
        }
      }
    }
  });
});
