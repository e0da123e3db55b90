import fs from 'node:fs';
import path from 'node:path';
import { Writable } from 'node:stream';
import { pino } from 'pino';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { newId } from '@revloop/db';
import { createCustomer, createJob, createShop } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';
import { ORPHAN_MIN_AGE_MS, recoverAtStartup } from './recover.service';

let t: TestApp;
beforeEach(async () => {
  t = await createTestApp();
});
afterEach(async () => {
  await t.close();
});

/** A logger that keeps its JSON lines, to check what recovery reports. */
function capturingLogger() {
  const lines: Record<string, unknown>[] = [];
  const stream = new Writable({
    write(chunk: Buffer, _enc, done) {
      lines.push(JSON.parse(chunk.toString()) as Record<string, unknown>);
      done();
    },
  });
  return { logger: pino({ level: 'info' }, stream), lines };
}

/** A customer with one job in log review (its files and an analysed log on disk) and one waiting for a log. */
async function jobsWithLogs() {
  const shop = await createShop(t);
  const customer = await createCustomer(t, shop);
  await createJob(t, shop, { state: 'log_review', customer });
  const waiting = await createJob(t, shop, { state: 'with_customer', customer });
  return { shop, customer, waiting };
}

const setAge = (file: string, ms: number) => {
  const at = new Date(t.clock.now().getTime() - ms);
  fs.utimesSync(file, at, at);
};

describe('start-up recovery', () => {
  it('empties the upload temp folder and says how much it removed', async () => {
    fs.writeFileSync(path.join(t.blobs.tempDir, 'cut-off.part'), Buffer.alloc(1000));
    fs.writeFileSync(t.blobs.tempPath(), Buffer.alloc(24));
    const { logger, lines } = capturingLogger();
    const { counts } = await recoverAtStartup({ ...t.deps, logger });
    expect(counts).toMatchObject({ tempFiles: 2, tempBytes: 1024 });
    expect(fs.readdirSync(t.blobs.tempDir)).toEqual([]);
    expect(lines).toEqual([expect.objectContaining({ msg: 'start-up recovery', tempFiles: 2, tempBytes: 1024, datalogsRequeued: 0 })]);
  });

  it('deletes blobs no row references once they are older than an hour, and keeps every referenced or recent one', async () => {
    await jobsWithLogs();
    const orphan = await t.blobs.putBytes(Buffer.from(`orphan ${newId()}`));
    const recent = await t.blobs.putBytes(Buffer.from(`recent ${newId()}`));
    setAge(t.blobs.pathOf(orphan.sha256), ORPHAN_MIN_AGE_MS + 60_000);
    setAge(t.blobs.pathOf(recent.sha256), ORPHAN_MIN_AGE_MS - 60_000);
    const referenced = await t.db.selectFrom('calibration_files').select('sha256').executeTakeFirstOrThrow();
    setAge(t.blobs.pathOf(referenced.sha256), 30 * 86_400_000);
    // A kit photo is a row that names a blob too.
    const shop = await createShop(t);
    const owner = await signIn(t.app, shop.owner.email);
    const kit = (await owner.post('/api/kits').send({ name: 'Kit P', interfaceSerial: 'IF-P-1', weeklyPriceMinor: 5000, depositMinor: 30000, lateFeePerDayMinor: 1000 })).body.data as { id: string };
    const photo = await t.blobs.putBytes(Buffer.from(`photo ${newId()}`));
    await t.db.insertInto('kit_photos').values({ id: newId(), shop_id: shop.id, kit_id: kit.id, sha256: photo.sha256, size_bytes: photo.size, content_type: 'image/png', original_name: 'kit.png', uploaded_by_user_id: null, created_at: new Date().toISOString() }).execute();
    setAge(t.blobs.pathOf(photo.sha256), 30 * 86_400_000);

    const { counts } = await recoverAtStartup(t.deps);
    expect(counts.orphanBlobs).toBeGreaterThanOrEqual(1);
    expect(fs.existsSync(t.blobs.pathOf(orphan.sha256))).toBe(false);
    expect(fs.existsSync(t.blobs.pathOf(recent.sha256))).toBe(true);
    expect(fs.existsSync(t.blobs.pathOf(referenced.sha256))).toBe(true);
    expect(fs.existsSync(t.blobs.pathOf(photo.sha256))).toBe(true);
    // Every file a row names is still on disk.
    const rows = [
      ...(await t.db.selectFrom('calibration_files').select('sha256').execute()),
      ...(await t.db.selectFrom('datalogs').select('sha256').execute()),
    ];
    expect(rows.filter((r) => !fs.existsSync(t.blobs.pathOf(r.sha256)))).toEqual([]);
  });

  it('re-queues a log left "processing" so it ends ready and moves its job without anyone opening it', async () => {
    const { shop, customer, waiting } = await jobsWithLogs();
    const customerId = customer.id;
    const jobId = waiting.id;
    // The row a crash leaves: stored file and row written by the customer, analysis never finished.
    const source = await t.db.selectFrom('datalogs').selectAll().where('shop_id', '=', shop.id).where('status', '=', 'ready').executeTakeFirstOrThrow();
    const round = (await t.db.selectFrom('jobs').select('round').where('id', '=', jobId).executeTakeFirstOrThrow()).round;
    const stuck = { ...source, id: newId(), job_id: jobId, round, status: 'processing' as const, report: null, error: null, uploaded_by: customerId };
    await t.db.insertInto('datalogs').values(stuck).execute();

    const { counts, analyses } = await recoverAtStartup(t.deps);
    expect(counts.datalogsRequeued).toBeGreaterThanOrEqual(1);
    await analyses;
    const after = await t.db.selectFrom('datalogs').select(['status', 'error']).where('id', '=', stuck.id).executeTakeFirstOrThrow();
    expect(after).toEqual({ status: 'ready', error: null });
    expect((await t.db.selectFrom('jobs').select('state').where('id', '=', jobId).executeTakeFirstOrThrow()).state).toBe('log_review');
    // Nothing is left "processing" anywhere.
    expect(await t.db.selectFrom('datalogs').select('id').where('status', '=', 'processing').execute()).toEqual([]);
  });

  it('fails a cut-off log whose uploader has left the shop, with a reason the shop can act on', async () => {
    const { shop } = await jobsWithLogs();
    const source = await t.db.selectFrom('datalogs').selectAll().where('shop_id', '=', shop.id).executeTakeFirstOrThrow();
    const stuck = { ...source, id: newId(), status: 'processing' as const, report: null, uploaded_by: null };
    await t.db.insertInto('datalogs').values(stuck).execute();
    const { counts } = await recoverAtStartup(t.deps);
    expect(counts.datalogsFailed).toBe(1);
    const after = await t.db.selectFrom('datalogs').select(['status', 'error']).where('id', '=', stuck.id).executeTakeFirstOrThrow();
    expect(after.status).toBe('failed');
    expect(after.error).toMatch(/restart.*Upload the log again/);
  });
});
