import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { newId } from '@revloop/db';
import { createJob, createShop, type TestShop } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';

let t: TestApp;
let shop: TestShop;
beforeAll(async () => {
  t = await createTestApp();
  shop = await createShop(t);
});
afterAll(async () => {
  await t.close();
});

/** Copies of one job walked to dialed in, under new numbers, in one transaction: a shop with a long history. */
async function addFinishedJobs(count: number) {
  const finished = await createJob(t, shop, { state: 'dialed_in' });
  const template = await t.db.selectFrom('jobs').selectAll().where('id', '=', finished.id).executeTakeFirstOrThrow();
  const { is_open: _computed, ...columns } = template;
  await t.db.transaction().execute(async (trx) => {
    for (let start = 0; start < count; start += 500) {
      const rows = Array.from({ length: Math.min(500, count - start) }, (_, k) => ({ ...columns, id: newId(), number: 100_000 + start + k }));
      await trx.insertInto('jobs').values(rows).execute();
    }
  });
}

describe('job CSV export of a large shop', () => {
  it('streams every matching job, past the 10,000 rows it used to stop at, with the count the list reports', { timeout: 60_000 }, async () => {
    await addFinishedJobs(10_050);
    const owner = await signIn(t.app, shop.owner.email);
    const list = await owner.get('/api/jobs?pageSize=1');
    const total = list.body.meta.total as number;
    // The walked job and its copies.
    expect(total).toBe(10_051);

    const res = await owner.get('/api/jobs/export.csv');
    expect(res.status).toBe(200);
    const lines = res.text.split('\r\n').filter(Boolean);
    expect(lines[0]).toMatch(/^Job,State,Round,Customer/);
    expect(lines.length - 1).toBe(total);
    // Every job once: the ids were taken in one read, so no job is skipped or repeated between batches.
    const numbers = lines.slice(1).map((l) => Number(l.split(',')[0]));
    expect(new Set(numbers).size).toBe(total);
  });
});
