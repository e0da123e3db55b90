import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createDemoTestApp } from '../../testing/demo-fixture';
import { signIn } from '../../testing/test-app';

let t: Awaited<ReturnType<typeof createDemoTestApp>>;
beforeEach(async () => {
  t = await createDemoTestApp();
});
afterEach(async () => {
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
    const owner = await signIn(t.app, 'owner@kestrel.test');
    const all: Event[] = [];
    for (const v of await vehicles(owner)) {
      const events = await history(owner, v.id);
      const times = events.map((e) => e.at);
      expect([...times].sort().reverse()).toEqual(times);
      all.push(...events);
    }
    const kinds = new Set(all.map((e) => e.kind));
    for (const kind of ['read', 'revision', 'log']) expect(kinds).toContain(kind);
    expect(all.some((e) => e.kind === 'revision' && e.notes)).toBe(true);
    expect(all.some((e) => e.kind === 'log' && (e.checks?.length ?? 0) > 0)).toBe(true);
  });

  it('proves a flash when a re-read has the image of a sent revision', async () => {
    const owner = await signIn(t.app, 'owner@kestrel.test');
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
    const owner = await signIn(t.app, 'owner@kestrel.test');
    const i3 = (await vehicles(owner)).find((v) => v.spec.engine.family === '1.5 turbo I3')!;
    const reads = (await history(owner, i3.id)).filter((e) => e.kind === 'read');
    expect(reads.length).toBeGreaterThan(0);
    // The demo's ECM reads are 256 KiB; Kestrel expects 512 or 128 KiB for this family.
    const flagged = reads.find((e) => e.plausibility?.status === 'unexpected_size')!;
    expect(flagged.plausibility!.message).toMatch(/256 KiB matches none/);
    const files = (await owner.get(`/api/jobs/${flagged.job.id}/files`)).body.data as Array<{ id: string; plausibility: { status: string } | null }>;
    expect(files.find((f) => f.id === flagged.fileId)!.plausibility!.status).toBe('unexpected_size');

    const turbo = (await vehicles(owner)).find((v) => v.spec.engine.family === '2.0 turbo I4')!;
    const ok = (await history(owner, turbo.id)).filter((e) => e.kind === 'read');
    expect(ok.every((e) => e.plausibility?.status === 'ok')).toBe(true);
  });

  it('the flag follows the shop setting and is shown to staff only', async () => {
    const owner = await signIn(t.app, 'owner@kestrel.test');
    const i3 = (await vehicles(owner)).find((v) => v.spec.engine.family === '1.5 turbo I3')!;
    const settings = (await owner.get('/api/shop')).body.data.settings;
    const patched = await owner.patch('/api/shop').send({ settings: { imageSizes: { ...settings.imageSizes, '1.5 turbo I3': [262144, 131072] } } });
    expect(patched.status).toBe(200);
    const reads = (await history(owner, i3.id)).filter((e) => e.kind === 'read');
    expect(reads.every((e) => e.plausibility?.status === 'ok')).toBe(true);
    expect((await owner.patch('/api/shop').send({ settings: { imageSizes: { v8: [] } } })).status).toBe(400);

    const customerEmail = i3.owner.email;
    const customer = await signIn(t.app, customerEmail);
    const job = reads[0]!.job.id;
    const files = (await customer.get(`/api/jobs/${job}/files`)).body.data as Array<{ plausibility: unknown }>;
    expect(files.every((f) => f.plausibility === null)).toBe(true);
  });

  it('answers 404 for another shop’s vehicle or one the viewer may not see', async () => {
    const kestrel = await signIn(t.app, 'owner@kestrel.test');
    const kVehicle = (await vehicles(kestrel))[0]!;
    expect((await (await signIn(t.app, 'owner@harbor.test')).get(`/api/vehicles/${kVehicle.id}/history`)).status).toBe(404);
    const notJordans = (await vehicles(kestrel)).find((v) => v.owner.email !== 'customer@kestrel.test')!;
    expect((await (await signIn(t.app, 'customer@kestrel.test')).get(`/api/vehicles/${notJordans.id}/history`)).status).toBe(404);
  });
});
