import { CompiledQuery, sql } from 'kysely';
import { describe, expect, it } from 'vitest';
import { JOB_STATES, OPEN_STATES, type JobState } from '@revloop/domain/jobs';
import { listAuditEventsQuery } from '../audit/audit-event.repository';
import type { Db } from '../client';
import { newId, nowIso } from '../ids';
import { insertPackage } from '../packages/package.repository';
import { testEngine } from '../testing/postgres';
import { twoShops } from '../testing/two-shops';
import { insertVehicle } from '../vehicles/vehicle.repository';
import { JOB_SORTS, countJobs, insertJob, listJobsQuery, updateJob, type JobListFilter } from './job.repository';

/** SQLite's own account of how it runs a query (EXPLAIN QUERY PLAN), one line per step. */
async function planOf(db: Db, query: { compile(): CompiledQuery }): Promise<string[]> {
  const compiled = query.compile();
  const result = await db.executeQuery<{ detail: string }>(CompiledQuery.raw(`explain query plan ${compiled.sql}`, [...compiled.parameters]));
  return result.rows.map((r) => r.detail);
}

/** A plan that reads in index order and stops at its page: no table scan, no sort of the matches. */
function expectIndexed(plan: string[], index: RegExp) {
  expect(plan.join('\n')).not.toMatch(/^SCAN /m);
  expect(plan.join('\n')).not.toMatch(/TEMP B-TREE/);
  expect(plan.find((line) => /\bjobs\b|audit_events/.test(line))).toMatch(index);
}

async function seedJobs(db: Db, shopId: string, customerId: string, count: number) {
  const at = nowIso();
  const vehicle = await insertVehicle(db, { id: newId(), shop_id: shopId, owner_user_id: customerId, vin: '1M8GDM9AXKP042788', model_year: 1989, description: 'Test coupe', spec: '{}', created_at: at, updated_at: at });
  const pkg = await insertPackage(db, { id: newId(), shop_id: shopId, name: 'Stage', modules: '["ECM"]', retail_price_minor: 50000, dealer_price_minor: 40000, rounds_included: 3, created_at: at });
  const ids: string[] = [];
  for (let i = 0; i < count; i++) {
    const job = await insertJob(db, {
      id: newId(),
      shop_id: shopId,
      number: 1001 + i,
      vehicle_id: vehicle.id,
      customer_user_id: customerId,
      package_id: pkg.id,
      state: JOB_STATES[i % JOB_STATES.length]!,
      goals: 'More power',
      log_request: '{}',
      cautions_accepted_at: at,
      state_changed_at: new Date(Date.now() - i * 60_000).toISOString(),
      created_at: at,
      updated_at: new Date(Date.now() - i * 30_000).toISOString(),
    });
    ids.push(job.id);
  }
  return ids;
}

const boardFilter: JobListFilter = { open: true };
const boardPage = { sort: 'state_changed' as const, direction: 'asc' as const, offset: 0, limit: 200 };

// The plans are SQLite's (EXPLAIN QUERY PLAN); PostgreSQL's planner answers a few test rows with a scan whatever the
// indexes, so its plans are judged at scale by the bench instead.
describe.skipIf(testEngine() === 'postgres')('board and job page queries at scale use their indexes', () => {
  it('the board (open jobs, longest in state first) reads the open-jobs index in order', async () => {
    const { db, shopA, ownerA } = await twoShops();
    await seedJobs(db, shopA, ownerA, 40);
    expectIndexed(await planOf(db, listJobsQuery(db, shopA, { kind: 'shop' }, boardFilter, boardPage)), /USING INDEX jobs_shop_open_state_changed/);
    // A tuner's board: the same index, with the scope checked on each open job.
    expectIndexed(await planOf(db, listJobsQuery(db, shopA, { kind: 'tuner', userId: ownerA }, boardFilter, boardPage)), /USING INDEX jobs_shop_open_state_changed/);
  });

  it.each(['number', 'created', 'updated', 'state_changed', 'state', 'round'] as const)('the table sorted by %s, either way, reads an index in order', async (sort) => {
    const { db, shopA, ownerA } = await twoShops();
    await seedJobs(db, shopA, ownerA, 40);
    for (const direction of ['asc', 'desc'] as const) {
      expectIndexed(await planOf(db, listJobsQuery(db, shopA, { kind: 'shop' }, {}, { sort, direction, offset: 0, limit: 25 })), /USING (COVERING )?INDEX (jobs_shop_|sqlite_autoindex_jobs_2 \(shop_id=\?\)$)/);
    }
  });

  it('the job timeline reads only that job’s events, newest first, through the subject index', async () => {
    const { db, shopA } = await twoShops();
    const plan = await planOf(db, listAuditEventsQuery(db, shopA, { subjectType: 'Job', subjectId: 'job-1', limit: 500 }));
    expectIndexed(plan, /USING INDEX audit_events_subject \(shop_id=\? AND subject_type=\? AND subject_id=\?\)/);
  });

  it('every sort the API offers is listed here or knowingly sorts in memory (customer and vehicle sort on joined names)', () => {
    expect(JOB_SORTS.filter((s) => !['number', 'created', 'updated', 'state_changed', 'state', 'round'].includes(s))).toEqual(['customer', 'vehicle']);
  });
});

describe('job counts kept by triggers', () => {
  it('agree with counting the rows after inserts, moves and deletes, per shop and state', async () => {
    const { db, shopA, shopB, ownerA, ownerB } = await twoShops();
    const idsA = await seedJobs(db, shopA, ownerA, 30);
    await seedJobs(db, shopB, ownerB, 7);
    await updateJob(db, shopA, idsA[0]!, { state: 'dialed_in' });
    await updateJob(db, shopA, idsA[1]!, { state: 'on_bench' });
    await updateJob(db, shopA, idsA[2]!, { goals: 'Unchanged state' });
    await db.deleteFrom('jobs').where('id', '=', idsA[3]!).execute();

    const counted = async (shopId: string, states?: JobState[]) =>
      Number(
        (
          await db
            .selectFrom('jobs')
            .select((eb) => eb.fn.countAll().as('n'))
            .where('shop_id', '=', shopId)
            .$if(Boolean(states), (q) => q.where('state', 'in', states!))
            .executeTakeFirstOrThrow()
        ).n,
      );
    for (const shopId of [shopA, shopB]) {
      expect(await countJobs(db, shopId, { kind: 'shop' }, {})).toBe(await counted(shopId));
      expect(await countJobs(db, shopId, { kind: 'shop' }, { states: ['on_bench', 'dialed_in'] })).toBe(await counted(shopId, ['on_bench', 'dialed_in']));
      expect(await countJobs(db, shopId, { kind: 'shop' }, { open: true })).toBe(await counted(shopId, [...OPEN_STATES]));
    }
    // The tally is what answers the unfiltered count: no row of the jobs table is read for it.
    if (testEngine() === 'postgres') return;
    const plan = await db.executeQuery<{ detail: string }>(
      CompiledQuery.raw(`explain query plan select sum(n) from job_state_counts where shop_id = ?`, [shopA]),
    );
    expect(plan.rows.map((r) => r.detail).join('\n')).not.toMatch(/\bjobs\b/);
  });

  it('is_open, computed by SQLite, agrees with the domain’s open states for every state', async () => {
    const { db, shopA, ownerA } = await twoShops();
    const ids = await seedJobs(db, shopA, ownerA, JOB_STATES.length);
    const rows = await db.selectFrom('jobs').select(['state', sql<number>`is_open`.as('is_open')]).where('id', 'in', ids).execute();
    for (const row of rows) expect([row.state, row.is_open === 1]).toEqual([row.state, (OPEN_STATES as readonly string[]).includes(row.state)]);
    expect(new Set(rows.map((r) => r.state))).toEqual(new Set(JOB_STATES));
  });
});
