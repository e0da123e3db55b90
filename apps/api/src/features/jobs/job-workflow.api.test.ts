import { findJob, inTransaction, listAuditEvents, listQueuedMails, snapshotDb } from '@revloop/db';
import { SYSTEM_ACTOR_NAME, defineAbilityFor, systemActorFor } from '@revloop/domain/auth';
import { testEngine } from '@revloop/db/testing';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createDealer, createMember, createShop, createJob, type TestJob, type TestShop } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';
import { drainMailOutbox } from '../mail/mail-outbox.service';
import { transitionJob } from './job-workflow.service';

// One writer of job state: the move, its audit event, its in-app notices and its queued e-mail commit or roll
// back together, and mail goes out only after the commit.

let t: TestApp;
let shop: TestShop;
beforeEach(async () => {
  t = await createTestApp();
  shop = await createShop(t);
});
afterEach(async () => {
  await t.close();
});

/** A job of a customer without a dealer, walked to `state` through the routes. */
const jobIn = (state: 'log_review' | 'with_customer'): Promise<TestJob> => createJob(t, shop, { state });
const owner = () => {
  const actor = { userId: shop.owner.id, platformAdmin: false, shopId: shop.id, role: 'owner' as const, dealerId: null, shopReadOnly: false };
  return { actor, ability: defineAbilityFor(actor), causedBy: actor.userId };
};
const counts = async (jobId: string) => ({
  events: (await listAuditEvents(t.db, shop.id, { subjectType: 'Job', subjectId: jobId, limit: 500 })).length,
  notices: (await t.db.selectFrom('notifications').select('id').where('job_id', '=', jobId).execute()).length,
  queued: (await listQueuedMails(t.db, 1000)).length,
});

/** Waits until the mail of earlier steps has gone out: the app sends after each commit without being awaited. */
async function outboxEmptied() {
  for (let i = 0; i < 200; i++) {
    await drainMailOutbox(t.deps);
    if ((await listQueuedMails(t.db, 1000)).length === 0) return;
    await new Promise((resolve) => setTimeout(resolve, 25));
  }
  throw new Error('the mail of earlier steps did not go out');
}

describe('the job workflow', () => {
  it('a move rolled back with its transaction leaves no state, audit event, notice or e-mail behind', async () => {
    const job = await jobIn('log_review');
    await outboxEmptied();
    const before = await counts(job.id);
    t.mailbox.clear();
    await expect(
      inTransaction(t.db, async (trx) => {
        const row = (await findJob(trx, job.shop.id, job.id))!;
        await transitionJob(t.deps, trx, row, 'dialed_in', owner());
        throw new Error('a later step of the same change failed');
      }),
    ).rejects.toThrow('a later step');
    await drainMailOutbox(t.deps);
    expect((await findJob(t.db, job.shop.id, job.id))!.state).toBe('log_review');
    expect(await counts(job.id)).toEqual(before);
    expect(t.mailbox.list()).toEqual([]);
  });

  it('a committed move writes its audit event and notices, and its e-mail survives a mail server that is down', async () => {
    const job = await jobIn('log_review');
    // The walk to log review sent its own mail (some of it may still be on its way): only this move's may be queued below.
    await outboxEmptied();
    const before = await counts(job.id);
    const send = t.deps.mailer.send;
    t.deps.mailer.send = () => Promise.reject(new Error('mail server down'));
    try {
      const owning = await signIn(t.app, shop.owner.email);
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
    expect(t.mailbox.list().some((m) => m.to.includes(job.customer.email) && /Dialed in/.test(m.subject))).toBe(true);
  });

  it('the system actor makes automatic moves under its own rules and shows as Revloop on the timeline', async () => {
    const job = await jobIn('with_customer');
    const system = { actor: systemActorFor(job.shop.id), causedBy: null };
    // Finishing a job is a person's call: the system actor may not.
    await expect(
      inTransaction(t.db, async (trx) => transitionJob(t.deps, trx, (await findJob(trx, job.shop.id, job.id))!, 'cancelled', system)),
    ).rejects.toMatchObject({ code: 'forbidden' });
    await t.db.updateTable('jobs').set({ has_log_for_round: 1 }).where('id', '=', job.id).execute();
    await inTransaction(t.db, async (trx) => transitionJob(t.deps, trx, (await findJob(trx, job.shop.id, job.id))!, 'log_review', system));
    const events = await listAuditEvents(t.db, job.shop.id, { subjectType: 'Job', subjectId: job.id, limit: 500 });
    const event = events.find((e) => e.action === 'job.moved' && (JSON.parse(e.details) as { to?: string }).to === 'log_review');
    expect(event).toMatchObject({ actor_user_id: null, details: expect.stringContaining('"automatic":true') });
    const owning = await signIn(t.app, shop.owner.email);
    const timeline = (await owning.get(`/api/jobs/${job.id}`)).body.data.timeline as Array<{ action: string; actor: string | null; text: string }>;
    expect(timeline.find((e) => e.text === 'Moved from With customer to Log review')).toMatchObject({ action: 'job.moved', actor: SYSTEM_ACTOR_NAME });
  });

  it('the buttons a job shows are the moves the server accepts, for each role', async () => {
    const job = await jobIn('with_customer');
    const dealer = await createMember(t, shop, 'dealer', { dealer: await createDealer(t, shop) });
    await t.db.updateTable('jobs').set({ has_log_for_round: 1 }).where('id', '=', job.id).execute();
    // Every move is tried on its own copy of this database, so one accepted move does not change the next. PostgreSQL
    // has no in-memory copy: there the move is tried on this app and the job's row is put back after it (a move
    // from here reads nothing else that a move writes).
    const world = testEngine() === 'postgres' ? undefined : snapshotDb(t.db);
    const saved = await t.db.selectFrom('jobs').selectAll().where('id', '=', job.id).executeTakeFirstOrThrow();
    const { is_open: _derived, id: _id, ...columns } = saved;
    const probeApp = async () =>
      world
        ? createTestApp({}, { database: world })
        : { app: t.app, close: async () => void (await t.db.updateTable('jobs').set(columns).where('id', '=', job.id).execute()) };
    for (const email of [shop.owner.email, job.customer.email, dealer.email]) {
      const agent = await signIn(t.app, email);
      const shown = await agent.get(`/api/jobs/${job.id}`);
      // The dealer does not see a job of a customer without a dealer at all.
      if (email === dealer.email) {
        expect(shown.status).toBe(404);
        continue;
      }
      const offered = (shown.body.data.transitions as Array<{ to: string }>).map((x) => x.to);
      for (const to of ['ready', 'on_bench', 'log_review', 'dialed_in', 'on_hold', 'cancelled']) {
        const probe = await probeApp();
        try {
          const again = await signIn(probe.app, email);
          const res = await again.post(`/api/jobs/${job.id}/transitions`).send({ to });
          expect(res.status === 200, `${email} → ${to}`).toBe(offered.includes(to));
        } finally {
          await probe.close();
        }
      }
    }
  });
});
