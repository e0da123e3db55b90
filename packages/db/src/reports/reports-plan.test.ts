import { CompiledQuery, type RawBuilder } from 'kysely';
import { describe, expect, it } from 'vitest';
import type { Db } from '../client';
import { customerPageQuery } from '../customers/customer.repository';
import { testEngine } from '../testing/postgres';
import { twoShops } from '../testing/two-shops';
import { dialedInQuery, stintsQuery, weeklyJobsQuery } from './reports.repository';

// The reports and the Customers list stay fast on a 10,000-job shop by reading small rows kept by their writers
// (job_stints, customer_summaries; migration 015) through indexes: these checks fail when a change makes SQLite scan.

/** SQLite's own account of how it runs a query (EXPLAIN QUERY PLAN), one line per step. */
async function planOf(db: Db, query: { compile(): CompiledQuery } | RawBuilder<unknown>): Promise<string> {
  const compiled = 'compile' in query && query.compile.length === 0 ? (query as { compile(): CompiledQuery }).compile() : (query as RawBuilder<unknown>).compile(db);
  const result = await db.executeQuery<{ detail: string }>(CompiledQuery.raw(`explain query plan ${compiled.sql}`, [...compiled.parameters]));
  return result.rows.map((r) => r.detail).join('\n');
}

const RANGE = { from: '2026-01-01T00:00:00.000Z', to: '2027-01-01T00:00:00.000Z' };

// SQLite's query plans (EXPLAIN QUERY PLAN); PostgreSQL plans its own way.
describe.skipIf(testEngine() === 'postgres')('report queries read their indexes', () => {
  it('turnaround and review times: the stints that ended in the range, from the covering index alone', async () => {
    const { db, shopA } = await twoShops();
    const plan = await planOf(db, stintsQuery(db, shopA, RANGE));
    expect(plan).toMatch(/SEARCH s USING COVERING INDEX job_stints_shop_left \(shop_id=\? AND left_at>\? AND left_at<\?\)/);
    expect(plan).not.toMatch(/audit_events|^SCAN /m);
  });

  it('rounds and jobs dialed in: the moves into Dialed in in the range, from the covering index alone', async () => {
    const { db, shopA } = await twoShops();
    const rounds = await planOf(db, dialedInQuery(db, shopA, RANGE).select(['m.round', (eb) => eb.fn.countAll().as('n')]).groupBy('m.round'));
    expect(rounds).toMatch(/SEARCH m USING COVERING INDEX job_stints_shop_to_left \(shop_id=\? AND to_state=\? AND left_at>\? AND left_at<\?\)/);
    expect(rounds).not.toMatch(/audit_events|^SCAN m/m);
  });

  it('weekly counts: two index range counts per week, no JSON read from audit events', async () => {
    const { db, shopA } = await twoShops();
    const weeks = [
      { key: '2026-09-07', start: '2026-09-06T22:00:00.000Z', end: '2026-09-13T22:00:00.000Z' },
      { key: '2026-09-14', start: '2026-09-13T22:00:00.000Z', end: '2026-09-20T22:00:00.000Z' },
    ];
    const plan = await planOf(db, weeklyJobsQuery(shopA, weeks));
    expect(plan).toMatch(/SEARCH m USING COVERING INDEX job_stints_shop_to_left \(shop_id=\? AND to_state=\? AND left_at>\? AND left_at<\?\)/);
    expect(plan).toMatch(/SEARCH j USING (COVERING )?INDEX \w+ \(shop_id=\? AND created_at>\? AND created_at<\?\)/);
    expect(plan).not.toMatch(/audit_events/);
  });

  it('the Customers list by money paid reads one summary row per customer, not the payments', async () => {
    const { db, shopA } = await twoShops();
    const plan = await planOf(db, customerPageQuery(db, shopA, { sort: 'paid', dir: 'desc', limit: 25, offset: 0 }));
    expect(plan).toMatch(/SEARCH cs USING PRIMARY KEY \(shop_id=\? AND customer_user_id=\?\)/);
    expect(plan).not.toMatch(/\bpayments\b|payment_refunds/);
  });
});
