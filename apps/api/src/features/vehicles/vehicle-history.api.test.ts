import fs from 'node:fs/promises';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { createCustomer, createJob, createTwoShops, createVehicle } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';
import { TEST_VEHICLE } from '../../testing/test-vehicle';

let t: TestApp;
let w: Awaited<ReturnType<typeof world>>;

const I3 = { ...TEST_VEHICLE, description: 'Test city car, 1.5 turbo I3', engine: { ...TEST_VEHICLE.engine, displacementL: 1.5, cylinders: 3, family: '1.5 turbo I3' } };

/**
 * Two customers: one with a 2.0 turbo I4 whose job had a read, a revision with notes, a log and a re-read of the
 * revision's image; one with a 1.5 turbo I3 whose job had a read and a revision. The shop expects the I4 read's size
 * for that family and sizes the I3 read does not have for the other.
 */
async function world() {
  const two = await createTwoShops(t);
  const i4Owner = two.people.customer;
  const i4 = await createVehicle(t, i4Owner);
  const i4Job = await createJob(t, two.shop, { customer: i4Owner, vehicle: i4, state: 'log_review' });
  const i3Owner = await createCustomer(t, two.shop);
  const i3 = await createVehicle(t, i3Owner, I3);
  const i3Job = await createJob(t, two.shop, { customer: i3Owner, vehicle: i3, state: 'with_customer' });

  const files = await t.db.selectFrom('calibration_files').selectAll().where('job_id', 'in', [i4Job.id, i3Job.id]).execute();
  const revision = files.find((f) => f.job_id === i4Job.id && f.kind === 'revision')!;
  // Test set-up: the revision carries notes, as the tuner writes them when sending it.
  await t.db.updateTable('calibration_files').set({ notes: 'Timing +2° in the midrange' }).where('id', '=', revision.id).execute();
  // The customer flashes the revision and reads the unit again: the re-read is the revision's own image.
  const customer = await signIn(t.app, i4Owner.email);
  const reRead = await customer
    .post(`/api/jobs/${i4Job.id}/files`)
    .field('module', revision.module)
    .field('kind', 're-read')
    .attach('file', await fs.readFile(t.blobs.pathOf(revision.sha256)), 're-read.bin');
  expect(reRead.status).toBe(201);

  const readBytes = (jobId: string) => files.find((f) => f.job_id === jobId && f.kind === 'read')!.image_bytes;
  const imageSizes = { '2.0 turbo I4': [readBytes(i4Job.id)], '1.5 turbo I3': [readBytes(i3Job.id) * 4, readBytes(i3Job.id) * 2] };
  expect((await (await signIn(t.app, two.shop.owner.email)).patch('/api/shop').send({ settings: { imageSizes } })).status).toBe(200);
  return { ...two, i4, i3, i3Owner, i4Owner, i4Job, i3Job, revision, reReadId: reRead.body.data.id as string };
}

// The tests share one world; the one that changes the shop's setting puts it back.
beforeAll(async () => {
  t = await createTestApp();
  w = await world();
});
afterAll(async () => {
  await t.close();
});

interface Event {
  kind: 'read' | 'revision' | 're_read' | 'log';
  at: string;
  job: { id: string; number: number };
  fileId?: string;
  notes?: string;
  plausibility?: { status: string; message: string };
  proves?: { fileId: string } | null;
  checks?: Array<{ id: string; status: string }>;
}

type Agent = Awaited<ReturnType<typeof signIn>>;
const vehicles = async (agent: Agent) =>
  (await agent.get('/api/vehicles')).body.data as Array<{ id: string; spec: { engine: { family: string } }; owner: { email: string } }>;
const history = async (agent: Agent, id: string) => (await agent.get(`/api/vehicles/${id}/history`)).body.data as Event[];

describe('GET /api/vehicles/:id/history', () => {
  it('lists the vehicle’s reads, revisions with notes, re-reads and logs with checks, newest first', async () => {
    const owner = await signIn(t.app, w.shop.owner.email);
    const all: Event[] = [];
    for (const v of await vehicles(owner)) {
      const events = await history(owner, v.id);
      const times = events.map((e) => e.at);
      expect([...times].sort().reverse()).toEqual(times);
      all.push(...events);
    }
    const kinds = new Set(all.map((e) => e.kind));
    for (const kind of ['read', 'revision', 're_read', 'log']) expect(kinds).toContain(kind);
    expect(all.filter((e) => e.kind === 'revision' && e.notes).map((e) => e.fileId)).toEqual([w.revision.id]);
    expect(all.some((e) => e.kind === 'log' && (e.checks?.length ?? 0) > 0)).toBe(true);
  });

  it('proves a flash when a re-read has the image of a sent revision', async () => {
    const owner = await signIn(t.app, w.shop.owner.email);
    const reReads = (await history(owner, w.i4.id)).filter((x) => x.kind === 're_read');
    expect(reReads.map((e) => [e.fileId, e.proves?.fileId])).toEqual([[w.reReadId, w.revision.id]]);
    for (const v of await vehicles(owner)) {
      for (const e of (await history(owner, v.id)).filter((x) => x.kind === 're_read')) {
        // [CP] the proof is the same image: the API's own re-read check compares CRC-32 and size the same way.
        const files = (await owner.get(`/api/jobs/${e.job.id}/files`)).body.data as Array<{ id: string; crc32: number; imageBytes: number }>;
        const reRead = files.find((f) => f.id === e.fileId)!;
        if (e.proves) {
          const rev = files.find((f) => f.id === e.proves!.fileId)!;
          expect([rev.crc32, rev.imageBytes]).toEqual([reRead.crc32, reRead.imageBytes]);
        }
      }
    }
  });

  it('flags a read whose size fits none expected for its engine family, on the history and the job’s file list', async () => {
    const owner = await signIn(t.app, w.shop.owner.email);
    const i3 = (await vehicles(owner)).find((v) => v.spec.engine.family === '1.5 turbo I3')!;
    const reads = (await history(owner, i3.id)).filter((e) => e.kind === 'read');
    expect(reads.length).toBeGreaterThan(0);
    // The world's shop expects two and four times this read's size for the family: the read is flagged.
    const flagged = reads.find((e) => e.plausibility?.status === 'unexpected_size')!;
    expect(flagged.plausibility!.message).toMatch(/matches none expected for this engine family/);
    const files = (await owner.get(`/api/jobs/${flagged.job.id}/files`)).body.data as Array<{ id: string; plausibility: { status: string } | null }>;
    expect(files.find((f) => f.id === flagged.fileId)!.plausibility!.status).toBe('unexpected_size');

    const turbo = (await vehicles(owner)).find((v) => v.spec.engine.family === '2.0 turbo I4')!;
    const ok = (await history(owner, turbo.id)).filter((e) => e.kind === 'read');
    expect(ok.every((e) => e.plausibility?.status === 'ok')).toBe(true);
  });

  it('the flag follows the shop setting and is shown to staff only', async () => {
    const owner = await signIn(t.app, w.shop.owner.email);
    const i3 = (await vehicles(owner)).find((v) => v.spec.engine.family === '1.5 turbo I3')!;
    const settings = (await owner.get('/api/shop')).body.data.settings;
    const readBytes = (await t.db.selectFrom('calibration_files').select('image_bytes').where('job_id', '=', w.i3Job.id).where('kind', '=', 'read').executeTakeFirstOrThrow()).image_bytes;
    const patched = await owner.patch('/api/shop').send({ settings: { imageSizes: { ...settings.imageSizes, '1.5 turbo I3': [readBytes, readBytes * 2] } } });
    expect(patched.status).toBe(200);
    const reads = (await history(owner, i3.id)).filter((e) => e.kind === 'read');
    expect(reads.every((e) => e.plausibility?.status === 'ok')).toBe(true);
    expect((await owner.patch('/api/shop').send({ settings: { imageSizes: { v8: [] } } })).status).toBe(400);

    const customerEmail = i3.owner.email;
    const customer = await signIn(t.app, customerEmail);
    const job = reads[0]!.job.id;
    const files = (await customer.get(`/api/jobs/${job}/files`)).body.data as Array<{ plausibility: unknown }>;
    expect(files.every((f) => f.plausibility === null)).toBe(true);
    expect((await owner.patch('/api/shop').send({ settings: { imageSizes: settings.imageSizes } })).status).toBe(200);
  });

  it('answers 404 for another shop’s vehicle or one the viewer may not see', async () => {
    expect((await (await signIn(t.app, w.other.owner.email)).get(`/api/vehicles/${w.i4.id}/history`)).status).toBe(404);
    expect((await (await signIn(t.app, w.i4Owner.email)).get(`/api/vehicles/${w.i3.id}/history`)).status).toBe(404);
    expect((await (await signIn(t.app, w.i4Owner.email)).get(`/api/vehicles/${w.i4.id}/history`)).status).toBe(200);
  });
});
