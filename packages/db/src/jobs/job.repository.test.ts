import { describe, expect, it } from 'vitest';
import { nowIso } from '../ids';
import { jobIn, twoShops } from '../testing/two-shops';
import { findJob, jobListVersion, listJobs, updateJob } from './job.repository';

const page = { sort: 'number' as const, direction: 'desc' as const, offset: 0, limit: 50 };

describe('job repository', () => {
  it('reads, lists and updates only the shop’s own jobs', async () => {
    const { db, shopA, shopB, ownerB } = await twoShops();
    const job = await jobIn(db, shopB, ownerB);
    expect(await findJob(db, shopA, job.id)).toBeUndefined();
    expect((await listJobs(db, shopA, { kind: 'shop' }, {}, page)).total).toBe(0);
    expect(await updateJob(db, shopA, job.id, { state: 'cancelled' })).toBeUndefined();
    expect((await findJob(db, shopB, job.id))?.state).toBe('ready');
  });

  it('applies role scopes inside the query', async () => {
    const { db, shopB, ownerB, ownerA } = await twoShops();
    // Assigned to a user who is not the one asking.
    const job = await jobIn(db, shopB, ownerB, { tunerId: ownerA });
    expect(await findJob(db, shopB, job.id, { kind: 'tuner', userId: 'me' })).toBeUndefined();
    expect(await findJob(db, shopB, job.id, { kind: 'customer', userId: 'not-the-customer' })).toBeUndefined();
    expect(await findJob(db, shopB, job.id, { kind: 'customer', userId: ownerB })).toBeDefined();
    expect(await findJob(db, shopB, job.id, { kind: 'dealer', dealerId: 'any' })).toBeUndefined();
  });

  it('refuses a move when the job is no longer in the expected state', async () => {
    const { db, shopB, ownerB } = await twoShops();
    const job = await jobIn(db, shopB, ownerB);
    expect(await updateJob(db, shopB, job.id, { state: 'on_bench' }, 'intake')).toBeUndefined();
    expect((await updateJob(db, shopB, job.id, { state: 'on_bench' }, 'ready'))?.state).toBe('on_bench');
  });
});

describe('job list version', () => {
  it('moves with every write a job list shows, only in the shops the write touches', async () => {
    const { db, shopA, shopB, ownerA, ownerB } = await twoShops();
    const versions = async () => [await jobListVersion(db, shopA), await jobListVersion(db, shopB)];
    const job = await jobIn(db, shopB, ownerB);
    const [a0, b0] = await versions();
    await updateJob(db, shopB, job.id, { state: 'on_bench' });
    const [a1, b1] = await versions();
    expect([a1, b1]).toEqual([a0, b0! + 1]);
    // Names shown on the list live in other tables: a rename moves the version of the shops it shows in.
    await db.updateTable('packages').set({ name: 'Stage 2' }).where('id', '=', job.package_id).execute();
    await db.updateTable('vehicles').set({ description: 'Test coupe, rebuilt' }).where('id', '=', job.vehicle_id).execute();
    await db.updateTable('users').set({ name: 'B. Owner' }).where('id', '=', ownerB).execute();
    expect(await versions()).toEqual([a0, b1! + 3]);
    await db.updateTable('users').set({ name: 'A. Owner' }).where('id', '=', ownerA).execute();
    expect(await versions()).toEqual([a0! + 1, b1! + 3]);
    // A column no list shows leaves the version alone.
    await db.updateTable('users').set({ last_sign_in_at: nowIso() }).where('id', '=', ownerB).execute();
    await db.deleteFrom('jobs').where('id', '=', job.id).execute();
    expect(await versions()).toEqual([a0! + 1, b1! + 4]);
  });
});
