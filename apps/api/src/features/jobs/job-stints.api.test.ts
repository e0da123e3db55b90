import { testEngine } from '@revloop/db/testing';
import { sql } from 'kysely';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createJob, createShop } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';

// The reports' time in each state reads job_stints: the one writer of job state writes the stint each move ends, in the
// move's transaction, chained so that each stint begins where the one before it ended.

let t: TestApp;
beforeAll(async () => {
  t = await createTestApp();
});
afterAll(() => t.close());

const HOUR = 3_600_000;
// In the order written (the test clock stands still while a job is walked, so several moves share an instant): SQLite's
// rowid, or on PostgreSQL the row's place in the table (job_stints is only ever appended to, so it is the same order).
const written = testEngine() === 'postgres' ? sql`ctid` : sql`rowid`;
const stintsOf = (jobId: string) => t.db.selectFrom('job_stints').selectAll().where('job_id', '=', jobId).orderBy(written).execute();
const movesOf = (jobId: string) =>
  t.db.selectFrom('audit_events').select(['id', 'actor_user_id', 'details', 'created_at']).where('subject_id', '=', jobId).where('action', '=', 'job.moved').orderBy('created_at').orderBy('id').execute();

describe('job stints', () => {
  it('a move writes the stint it ends: the state left, since the last change, until now, by whom, into what', async () => {
    const shop = await createShop(t);
    const job = await createJob(t, shop, { state: 'on_bench' });
    const enteredAt = (await t.db.selectFrom('jobs').select('state_changed_at').where('id', '=', job.id).executeTakeFirstOrThrow()).state_changed_at;
    const before = await stintsOf(job.id);

    t.clock.advance(5 * HOUR);
    const owner = await signIn(t.app, shop.owner.email);
    expect((await owner.post(`/api/jobs/${job.id}/transitions`).send({ to: 'on_hold' })).status).toBe(200);

    const after = await stintsOf(job.id);
    expect(after).toHaveLength(before.length + 1);
    const stint = after.find((s) => !before.some((b) => b.id === s.id))!;
    const move = (await movesOf(job.id)).at(-1)!;
    expect(stint).toMatchObject({
      id: move.id,
      shop_id: shop.id,
      state: 'on_bench',
      entered_at: enteredAt,
      left_at: t.clock.now().toISOString(),
      to_state: 'on_hold',
      round: 0,
      left_by_user_id: shop.owner.id,
    });
    expect(Date.parse(stint.left_at) - Date.parse(stint.entered_at)).toBe(5 * HOUR);
    expect(stint.hours).toBe(5);
  });

  it('every move of a job has its stint, and each stint begins where the one before it ended', async () => {
    const shop = await createShop(t);
    const job = await createJob(t, shop, { state: 'dialed_in', round: 2 });
    const [stints, moves] = [await stintsOf(job.id), await movesOf(job.id)];
    expect(stints.map((s) => s.id).sort()).toEqual(moves.map((m) => m.id).sort());
    for (const s of stints) {
      const details = JSON.parse(moves.find((m) => m.id === s.id)!.details) as { from: string; to: string; round: number };
      expect([s.state, s.to_state, s.round]).toEqual([details.from, details.to, details.round]);
    }
    const opened = (await t.db.selectFrom('jobs').select('created_at').where('id', '=', job.id).executeTakeFirstOrThrow()).created_at;
    expect(stints[0]).toMatchObject({ state: 'intake', entered_at: opened });
    for (let k = 1; k < stints.length; k++) {
      expect(stints[k]!.state).toBe(stints[k - 1]!.to_state);
      expect(stints[k]!.entered_at).toBe(stints[k - 1]!.left_at);
    }
    expect(stints.at(-1)).toMatchObject({ to_state: 'dialed_in', round: 2 });
  });

  it('a move refused by the state machine writes no stint', async () => {
    const shop = await createShop(t);
    const job = await createJob(t, shop, { state: 'ready' });
    const before = await stintsOf(job.id);
    const owner = await signIn(t.app, shop.owner.email);
    expect((await owner.post(`/api/jobs/${job.id}/transitions`).send({ to: 'dialed_in' })).status).toBe(409);
    expect(await stintsOf(job.id)).toEqual(before);
  });
});
