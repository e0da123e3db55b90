import { createHash } from 'node:crypto';
import fs from 'node:fs';
import path from 'node:path';
import { crc32 as zlibCrc32 } from 'node:zlib';
import MemoryMap from 'nrf-intel-hex';
import request from 'supertest';
import { afterEach, beforeEach, describe, expect, it } from 'vitest';
import { createDemoTestApp, type SeededJob } from '../../testing/demo-fixture';
import { signIn, TEST_ORIGIN } from '../../testing/test-app';
import { signFileLink } from './file-links';

let t: Awaited<ReturnType<typeof createDemoTestApp>>;
beforeEach(async () => {
  t = await createDemoTestApp();
});
afterEach(async () => {
  await t.close();
});

// Intel HEX data record and EOF record as published (Wikipedia "Intel HEX", record examples) [3P].
const HEX_EXAMPLE = ':10010000214601360121470136007EFE09D2190140\n:00000001FF\n';
// The same four bytes as Intel `:04FEDC00210080CFB2`, as an S1 record; S9 end record checksum ~(03+00+00) = FC [3P][CALC].
const SREC_EXAMPLE = 'S107FEDC210080CFAE\nS9030000FC\n';

/** A raw image: every byte value twice, so it holds control bytes and 0xFF and is binary beyond doubt. */
const rawImage = (seed = 0) => Buffer.from(Array.from({ length: 512 }, (_, i) => (i + seed) & 0xff));

const usersByEmail = async (email: string) => (await t.db.selectFrom('users').select('id').where('email', '=', email).executeTakeFirstOrThrow()).id;
const emailOf = async (userId: string) => (await t.db.selectFrom('users').select('email').where('id', '=', userId).executeTakeFirstOrThrow()).email;
const jobRow = (id: string) => t.db.selectFrom('jobs').selectAll().where('id', '=', id).executeTakeFirstOrThrow();

function seeded(where: (j: SeededJob) => boolean): SeededJob {
  const job = t.ids.jobs.find(where);
  if (!job) throw new Error('no seeded job fits');
  return job;
}

async function tunerOf(jobId: string) {
  const row = await jobRow(jobId);
  return row.assigned_tuner_id ? signIn(t.app, await emailOf(row.assigned_tuner_id)) : signIn(t.app, 'owner@kestrel.test');
}

const upload = (agent: ReturnType<typeof request.agent>, jobId: string, body: Buffer, name: string, fields: Record<string, string>) => {
  let req = agent.post(`/api/jobs/${jobId}/files`);
  for (const [key, value] of Object.entries(fields)) req = req.field(key, value);
  return req.attach('file', body, name);
};

/**
 * Sends the job's revision drafts the way the shop does: Kestrel asks for a second person's approval, so every draft
 * is approved by whoever of the owner and the tuners may approve it (never its uploader), then `sender` sends the
 * revision with its "what changed" note (the drafts flow itself is tested in revision-drafts.api.test.ts).
 */
async function approveAndSend(sender: ReturnType<typeof request.agent>, jobId: string, note = 'Fuel and spark for the intake.') {
  for (const email of ['owner@kestrel.test', 'tuner@kestrel.test', 'tuner2@kestrel.test']) {
    const reviewer = await signIn(t.app, email);
    const files = (await reviewer.get(`/api/jobs/${jobId}/files`)).body.data as Array<{ id: string; canApprove: boolean }> | undefined;
    for (const file of files ?? []) if (file.canApprove) expect((await reviewer.post(`/api/files/${file.id}/approve`)).status).toBe(200);
  }
  const sent = await sender.post(`/api/jobs/${jobId}/transitions`).send({ to: 'with_customer', note });
  expect(sent.status, JSON.stringify(sent.body)).toBe(200);
  return sent;
}

function filesOnDisk(): string[] {
  const walk = (dir: string): string[] =>
    fs.existsSync(dir) ? fs.readdirSync(dir, { withFileTypes: true }).flatMap((e) => (e.isDirectory() ? walk(path.join(dir, e.name)) : [path.join(dir, e.name)])) : [];
  return walk(t.blobs.root);
}
const fileRowCount = async () => Number((await t.db.selectFrom('calibration_files').select((eb) => eb.fn.countAll().as('n')).executeTakeFirstOrThrow()).n);

const kestrelJob = (state: SeededJob['state'], more: (j: SeededJob) => boolean = () => true) =>
  seeded((j) => j.shopId === t.ids.kestrel.shopId && j.state === state && more(j));

describe('upload', () => {
  it('stores each format with SHA-256 of the file, CRC-32 of the image, format and ranges', async () => {
    const job = kestrelJob('intake', (j) => j.dealerId === null);
    const customer = await signIn(t.app, await emailOf(job.customerUserId));

    const hex = await upload(customer, job.id, Buffer.from(HEX_EXAMPLE), 'stock.hex', { module: 'ECM', kind: 'read' });
    expect(hex.status).toBe(201);
    // Oracles: Node crypto for SHA-256 (FIPS 180-2), zlib for CRC-32 (IEEE), nrf-intel-hex for the parse [3P].
    const oracle = MemoryMap.fromHex(HEX_EXAMPLE);
    const [[start, bytes]] = [...oracle.entries()] as [[number, Uint8Array]];
    expect(hex.body.data).toMatchObject({
      format: 'intel_hex',
      sha256: createHash('sha256').update(HEX_EXAMPLE).digest('hex'),
      crc32: zlibCrc32(bytes),
      sizeBytes: HEX_EXAMPLE.length,
      imageBytes: bytes.length,
      ranges: [{ start, end: start + bytes.length }],
      kind: 'read',
      module: 'ECM',
    });

    const srec = await upload(customer, job.id, Buffer.from(SREC_EXAMPLE), 'stock.s19', { module: 'TCM', kind: 'read' });
    expect(srec.status).toBe(201);
    expect(srec.body.data).toMatchObject({ format: 'srec', ranges: [{ start: 0xfedc, end: 0xfee0 }], crc32: zlibCrc32(Buffer.from([0x21, 0x00, 0x80, 0xcf])) });

    const raw = rawImage();
    const bin = await upload(customer, job.id, raw, 'stock.bin', { module: 'other', kind: 'read' });
    expect(bin.status).toBe(201);
    expect(bin.body.data).toMatchObject({ format: 'raw', crc32: zlibCrc32(raw), ranges: [{ start: 0, end: 512 }], sha256: createHash('sha256').update(raw).digest('hex') });
    expect(fs.readdirSync(t.blobs.tempDir)).toEqual([]);
  });

  it('stores the same content once, and moves an intake job to ready on its first read', async () => {
    const job = kestrelJob('intake', (j) => j.dealerId === null);
    const customer = await signIn(t.app, await emailOf(job.customerUserId));
    const before = filesOnDisk().length;
    const first = await upload(customer, job.id, rawImage(3), 'a.bin', { module: 'ECM', kind: 'read' });
    const second = await upload(customer, job.id, rawImage(3), 'b.bin', { module: 'ECM', kind: 're-read' });
    expect([first.status, second.status]).toEqual([201, 201]);
    expect(second.body.data.kind).toBe('re_read');
    expect(filesOnDisk().length).toBe(before + 1);
    expect(first.body.meta.movedTo).toBe('ready');
    expect((await jobRow(job.id)).state).toBe('ready');
    expect((await jobRow(job.id)).has_stock_read).toBe(1);
    const owner = await signIn(t.app, 'owner@kestrel.test');
    const timeline = (await owner.get(`/api/jobs/${job.id}`)).body.data.timeline.map((e: { text: string }) => e.text);
    expect(timeline).toContain('Read (ECM) uploaded, Raw binary');
    expect(timeline).toContain('Moved from Intake to Ready');
  });

  describe('bad input gets a clear error and leaves nothing behind', () => {
    const cases: Array<[string, Buffer, string, Record<string, string>, number, RegExp]> = [
      ['an empty file', Buffer.alloc(0), 'empty.bin', { module: 'ECM', kind: 'read' }, 422, /empty/i],
      // Last byte of the published record changed from 40 to 41, so the checksum no longer sums to zero [CALC].
      ['HEX with a bad checksum', Buffer.from(':020000040000FA\n:10010000214601360121470136007EFE09D2190141\n:00000001FF\n'), 'bad.hex', { module: 'ECM', kind: 'read' }, 422, /Line 2/],
      ['a truncated record', Buffer.from(':1001000021460136012147\n:00000001FF\n'), 'cut.hex', { module: 'ECM', kind: 'read' }, 422, /Line 1/],
      ['a garbled record', Buffer.from(':10010000214601360121470136007EFE09D2190140\n:0000zz01FF\n'), 'garbled.hex', { module: 'ECM', kind: 'read' }, 422, /Line 2/],
      // Length byte 08 where the record holds 7 bytes after it [CALC].
      ['an S-record with a wrong length byte', Buffer.from('S108FEDC210080CFAE\nS9030000FC\n'), 'bad.s19', { module: 'ECM', kind: 'read' }, 422, /Line 1/],
      ['a binary named .hex', rawImage(), 'image.hex', { module: 'ECM', kind: 'read' }, 422, /binary/],
      ['text that is neither format', Buffer.from('hello, this is a letter\n'), 'letter.txt', { module: 'ECM', kind: 'read' }, 422, /neither/],
      ['a name with control characters', rawImage(), 'evil\u0007name.bin', { module: 'ECM', kind: 'read' }, 400, /control characters/],
      ['a name with an escape character', rawImage(), 'evil\u001bname.bin', { module: 'ECM', kind: 'read' }, 400, /control characters/],
      // U+202E RIGHT-TO-LEFT OVERRIDE makes "stock\u202Enib.exe" display as "stockexe.bin" (Unicode UAX #9) [STD].
      ['a name with a right-to-left override', rawImage(), 'stock\u202Enib.exe', { module: 'ECM', kind: 'read' }, 400, /text-direction/],
      ['a name with a left-to-right isolate', rawImage(), 'stock\u2066.bin', { module: 'ECM', kind: 'read' }, 400, /text-direction/],
      ['a missing module', rawImage(), 'ok.bin', { kind: 'read' }, 400, /module/],
    ];
    it.each(cases)('%s', async (_label, body, name, fields, status, message) => {
      const job = kestrelJob('intake', (j) => j.dealerId === null);
      const customer = await signIn(t.app, await emailOf(job.customerUserId));
      const [disk, rows] = [filesOnDisk(), await fileRowCount()];
      const res = await upload(customer, job.id, body, name, fields);
      expect(res.status).toBe(status);
      expect(res.body.error.message).toMatch(message);
      expect(fs.readdirSync(t.blobs.tempDir)).toEqual([]);
      expect(filesOnDisk()).toEqual(disk);
      expect(await fileRowCount()).toBe(rows);
      expect((await jobRow(job.id)).state).toBe('intake');
    });

    it('a name with ../ never reaches the store with its directory parts', async () => {
      const job = kestrelJob('intake', (j) => j.dealerId === null);
      const customer = await signIn(t.app, await emailOf(job.customerUserId));
      const res = await upload(customer, job.id, rawImage(), '../../etc/stock.bin', { module: 'ECM', kind: 'read' });
      // multer strips directory parts before the name reaches the API; a refusal would be as safe.
      if (res.status === 201) expect(res.body.data.originalName).toBe('stock.bin');
      else expect(res.status).toBe(400);
      expect(fs.readdirSync(t.blobs.tempDir)).toEqual([]);
    });

    it('over the shop’s limit: 413 with nothing on disk', async () => {
      await t.db.updateTable('shops').set({ settings: JSON.stringify({ uploadLimitMiB: 1 }) }).where('id', '=', t.ids.kestrel.shopId).execute();
      const job = kestrelJob('intake', (j) => j.dealerId === null);
      const customer = await signIn(t.app, await emailOf(job.customerUserId));
      const disk = filesOnDisk();
      const res = await upload(customer, job.id, Buffer.alloc(1024 * 1024 + 1, 0xff), 'big.bin', { module: 'ECM', kind: 'read' });
      expect(res.status).toBe(413);
      expect(res.body.error.message).toMatch(/1 MiB/);
      expect(fs.readdirSync(t.blobs.tempDir)).toEqual([]);
      expect(filesOnDisk()).toEqual(disk);
    });

    it('a customer may not upload a revision; another shop’s job is a 404; no session is a 401', async () => {
      const job = kestrelJob('on_bench', (j) => j.dealerId === null);
      const customer = await signIn(t.app, await emailOf(job.customerUserId));
      const [disk, rows] = [filesOnDisk(), await fileRowCount()];
      const refused = await upload(customer, job.id, rawImage(), 'mine.bin', { module: 'ECM', kind: 'revision' });
      expect(refused.status).toBe(403);
      expect(refused.body.error.message).toMatch(/tuners and owner/);
      const harbor = await signIn(t.app, 'owner@harbor.test');
      expect((await upload(harbor, job.id, rawImage(), 'x.bin', { module: 'ECM', kind: 'read' })).status).toBe(404);
      expect((await upload(request.agent(t.app), job.id, rawImage(), 'x.bin', { module: 'ECM', kind: 'read' })).status).toBe(401);
      expect(fs.readdirSync(t.blobs.tempDir)).toEqual([]);
      expect(filesOnDisk()).toEqual(disk);
      expect(await fileRowCount()).toBe(rows);
    });

    it('a revision outside the bench is refused with the job’s state', async () => {
      const job = kestrelJob('with_customer');
      const tuner = await tunerOf(job.id);
      const res = await upload(tuner, job.id, rawImage(9), 'rev.bin', { module: job.modules[0]!, kind: 'revision' });
      expect(res.status).toBe(409);
      expect(res.body.error.message).toMatch(/On the bench; this job is With customer/);
      expect(fs.readdirSync(t.blobs.tempDir)).toEqual([]);
    });
  });
});

describe('revisions and the job flow', () => {
  it('numbers revisions per module, waits for every package module, then sends the job with signed links and cautions', async () => {
    const job = kestrelJob('on_bench', (j) => j.round === 0 && j.modules.length === 2);
    const tuner = await tunerOf(job.id);
    const ecm = await upload(tuner, job.id, rawImage(1), 'ecm-rev.bin', { module: 'ECM', kind: 'revision', notes: 'Fuel and spark for the intake.' });
    expect(ecm.status).toBe(201);
    expect(ecm.body.data).toMatchObject({ revisionNumber: 1, forRound: 1, notes: 'Fuel and spark for the intake.' });
    expect(ecm.body.meta.waitingFor).toEqual(['TCM']);
    expect((await jobRow(job.id)).state).toBe('on_bench');
    const list = (await tuner.get(`/api/jobs/${job.id}/files`)).body.data as Array<{ id: string; kind: string; module: string }>;
    const ecmRead = list.find((f) => f.kind === 'read' && f.module === 'ECM');
    if (ecmRead) expect(ecm.body.data.parentFileId).toBe(ecmRead.id);

    t.mailbox.clear();
    const tcm = await upload(tuner, job.id, Buffer.from(SREC_EXAMPLE), 'tcm-rev.s19', { module: 'TCM', kind: 'revision' });
    expect(tcm.status).toBe(201);
    // Every module is in: the drafts wait for approval and Send revision, the job stays on the bench until then.
    expect(tcm.body.meta.waitingFor).toEqual([]);
    expect((await jobRow(job.id)).state).toBe('on_bench');
    await approveAndSend(tuner, job.id);
    const row = await jobRow(job.id);
    expect([row.state, row.round]).toEqual(['with_customer', 1]);

    const customerEmail = await emailOf(job.customerUserId);
    const mail = t.mailbox.list().find((m) => m.to.includes(customerEmail));
    expect(mail?.subject).toMatch(/Revision 1 is ready/);
    expect(mail?.text).toMatch(/battery supporter/);
    expect(mail?.text).toMatch(/do not interrupt/);
    const links = [...(mail?.text ?? '').matchAll(new RegExp(`${TEST_ORIGIN}/api/files/\\S+`, 'g'))].map((m) => m[0]);
    expect(links).toHaveLength(2);

    // The signed link downloads without a session, names the file for the customer, and lands on the timeline.
    const viaLink = await request(t.app).get(links[1]!.slice(TEST_ORIGIN.length));
    expect(viaLink.status).toBe(200);
    expect(viaLink.headers['content-disposition']).toMatch(/^attachment; filename="?[a-z0-9-]+-tcm-rev1\.s19"?$/);
    expect(viaLink.headers['x-content-type-options']).toBe('nosniff');
    expect(Buffer.from(viaLink.body as Buffer).toString()).toBe(SREC_EXAMPLE);
    const owner = await signIn(t.app, 'owner@kestrel.test');
    const timeline = (await owner.get(`/api/jobs/${job.id}`)).body.data.timeline.map((e: { text: string }) => e.text);
    expect(timeline).toContain('Rev 1 (TCM) downloaded through an e-mailed link');
  });

  it('the customer’s and the dealer’s timelines leave out revisions not sent yet, as their files list does', async () => {
    for (const [dealerSide, viewerEmail] of [[false, null], [true, 'dealer@kestrel.test']] as const) {
      const job = kestrelJob('on_bench', (j) => j.modules.length === 2 && (j.dealerId !== null) === dealerSide);
      const tuner = await tunerOf(job.id);
      const viewer = await signIn(t.app, viewerEmail ?? (await emailOf(job.customerUserId)));
      const uploads = async (agent: ReturnType<typeof request.agent>) =>
        (await agent.get(`/api/jobs/${job.id}`)).body.data.timeline.filter((e: { text: string }) => new RegExp(`^Revision ${job.round + 1} \\(ECM\\) uploaded`).test(e.text)).length;
      expect(await uploads(tuner)).toBe(0);
      // One module of two: the revision waits as a draft, unseen by the customer side.
      expect((await upload(tuner, job.id, rawImage(7), 'ecm-draft.bin', { module: 'ECM', kind: 'revision' })).status).toBe(201);
      expect((await viewer.get(`/api/jobs/${job.id}/files`)).body.data.filter((f: { kind: string; module: string; revisionNumber: number | null }) => f.kind === 'revision' && f.module === 'ECM' && f.revisionNumber === job.round + 1)).toEqual([]);
      expect(await uploads(viewer)).toBe(0);
      expect(await uploads(tuner)).toBe(1);
    }
  });

  it('a signed link stops working when expired or tampered with', async () => {
    const job = kestrelJob('on_bench', (j) => j.round === 0 && j.modules.length === 2);
    const tuner = await tunerOf(job.id);
    await upload(tuner, job.id, rawImage(1), 'ecm.bin', { module: 'ECM', kind: 'revision' });
    t.mailbox.clear();
    await upload(tuner, job.id, rawImage(2), 'tcm.bin', { module: 'TCM', kind: 'revision' });
    await approveAndSend(tuner, job.id);
    const mail = t.mailbox.list().find((m) => m.subject.includes('Revision 1 is ready'))!;
    const link = mail.text.match(new RegExp(`${TEST_ORIGIN}(/api/files/\\S+)`))![1]!;
    const url = new URL(link, TEST_ORIGIN);
    const sig = url.searchParams.get('sig')!;
    const tampered = link.replace(`sig=${sig}`, `sig=${sig.slice(0, -2)}${sig.endsWith('AA') ? 'BB' : 'AA'}`);
    expect((await request(t.app).get(tampered)).status).toBe(403);
    const laterExp = link.replace(/exp=\d+/, `exp=${Number(url.searchParams.get('exp')) + 86_400}`);
    expect((await request(t.app).get(laterExp)).status).toBe(403);
    // Signed with the app's own key but dated 2099: refused, expiry is capped at the 7-day link lifetime.
    const fileId = url.pathname.split('/')[3]!;
    const shop = url.searchParams.get('shop')!;
    const exp2099 = Math.floor(Date.parse('2099-01-01T00:00:00Z') / 1000);
    const farSig = signFileLink(t.env.FILE_LINK_SECRET, { shopId: shop, fileId, exp: exp2099 });
    expect((await request(t.app).get(`/api/files/${fileId}/download?shop=${shop}&exp=${exp2099}&sig=${farSig}`)).status).toBe(403);
    // The development key that used to be a constant in the source signs nothing any more.
    const oldKeySig = signFileLink('revloop-development-file-link-secret-not-for-production', { shopId: shop, fileId, exp: Number(url.searchParams.get('exp')) });
    expect((await request(t.app).get(link.replace(`sig=${sig}`, `sig=${oldKeySig}`))).status).toBe(403);
    expect((await request(t.app).get(link)).status).toBe(200);
    t.clock.advance(7 * 86_400_000 + 1000);
    const expired = await request(t.app).get(link);
    expect(expired.status).toBe(403);
    expect(expired.body.error.message).toMatch(/expired/);
  });
});

describe('access', () => {
  /** A dealer job on the bench with a read by the dealer and a sent revision, plus a read only the dealer uploaded. */
  async function dealerJobWithFiles() {
    const job = seeded((j) => j.dealerId !== null && j.state === 'with_customer');
    const row = await jobRow(job.id);
    const dealer = await signIn(t.app, 'dealer@kestrel.test');
    const read = await upload(dealer, job.id, rawImage(40), 'dealer-read.bin', { module: job.modules[0]!, kind: 'read' });
    expect(read.status).toBe(201);
    const revisions = await t.db
      .selectFrom('calibration_files')
      .select(['id', 'module'])
      .where('job_id', '=', job.id)
      .where('kind', '=', 'revision')
      .execute();
    return { job, row, dealerRead: read.body.data.id as string, revision: revisions[0]?.id };
  }

  it('lets each role reach exactly the files it may: role × route', async () => {
    const { job, row, dealerRead, revision } = await dealerJobWithFiles();
    expect(revision).toBeDefined();
    const assignedTuner = row.assigned_tuner_id!;
    const otherTuner = t.ids.kestrel.tunerIds.find((id) => id !== assignedTuner)!;
    const otherCustomer = t.ids.kestrel.customerIds[0]!;
    const who: Array<[string, string, { list: number; read: number; revision: number; verify: number }]> = [
      ['owner', 'owner@kestrel.test', { list: 200, read: 200, revision: 200, verify: 200 }],
      ['assigned tuner', await emailOf(assignedTuner), { list: 200, read: 200, revision: 200, verify: 200 }],
      ['another tuner', await emailOf(otherTuner), { list: 404, read: 404, revision: 404, verify: 404 }],
      ['the dealer', 'dealer@kestrel.test', { list: 200, read: 200, revision: 200, verify: 403 }],
      // The dealer's read is not the customer's own upload, so for the customer it does not exist.
      ['the job’s customer', await emailOf(job.customerUserId), { list: 200, read: 404, revision: 200, verify: 404 }],
      ['another customer', await emailOf(otherCustomer), { list: 404, read: 404, revision: 404, verify: 404 }],
      ['another shop’s owner', 'owner@harbor.test', { list: 404, read: 404, revision: 404, verify: 404 }],
    ];
    for (const [label, email, expected] of who) {
      const agent = await signIn(t.app, email);
      const got = {
        list: (await agent.get(`/api/jobs/${job.id}/files`)).status,
        read: (await agent.get(`/api/files/${dealerRead}/download`)).status,
        revision: (await agent.get(`/api/files/${revision}/download`)).status,
        verify: (await agent.get(`/api/files/${dealerRead}/verify`)).status,
      };
      expect({ label, ...got }).toEqual({ label, ...expected });
    }
    expect((await request(t.app).get(`/api/files/${revision}/download`)).status).toBe(401);
  });

  it('shows the customer only revisions and their own uploads', async () => {
    const { job } = await dealerJobWithFiles();
    const customer = await signIn(t.app, await emailOf(job.customerUserId));
    const mine = await upload(customer, job.id, rawImage(77), 'my-re-read.bin', { module: job.modules[0]!, kind: 're_read' });
    expect(mine.status).toBe(201);
    const list = (await customer.get(`/api/jobs/${job.id}/files`)).body;
    const customerId = await usersByEmail(await emailOf(job.customerUserId));
    expect(list.data.length).toBeGreaterThan(1);
    for (const f of list.data as Array<{ kind: string; uploadedBy: { id: string } }>) {
      expect(f.kind === 'revision' || f.uploadedBy.id === customerId).toBe(true);
    }
    expect(list.meta).toMatchObject({ canUpload: true, canUploadRevision: false, canVerify: false });
  });

  it('downloads with safe headers and records every download on the job timeline', async () => {
    const { job, revision } = await dealerJobWithFiles();
    const customer = await signIn(t.app, await emailOf(job.customerUserId));
    const res = await customer.get(`/api/files/${revision}/download`).buffer(true);
    expect(res.status).toBe(200);
    const surname = job.customerName.split(' ').at(-1)!.toLowerCase();
    expect(res.headers['content-disposition']).toMatch(new RegExp(`^attachment; filename="?${surname}-\\d{4}-[a-z0-9-]+-(ecm|tcm)-rev1\\.(bin|hex|s19|s28|s37|srec)"?$`));
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['content-type']).toBe('application/octet-stream');
    const stored = await t.db.selectFrom('calibration_files').select(['sha256', 'size_bytes']).where('id', '=', revision!).executeTakeFirstOrThrow();
    expect(createHash('sha256').update(res.body as Buffer).digest('hex')).toBe(stored.sha256);
    const owner = await signIn(t.app, 'owner@kestrel.test');
    const timeline = (await owner.get(`/api/jobs/${job.id}`)).body.data.timeline as Array<{ text: string; actor: string | null }>;
    expect(timeline.filter((e) => /Rev 1 \((ECM|TCM)\) downloaded$/.test(e.text)).map((e) => e.actor)).toContain(job.customerName);
  });
});

describe('proof of what is on the car', () => {
  /** A job on the bench: a read, then Rev 1 sent to the customer, by the API itself. */
  async function sentJob() {
    const job = kestrelJob('ready', (j) => j.modules.length === 1 && j.modules[0] === 'ECM');
    const owner = await signIn(t.app, 'owner@kestrel.test');
    expect((await owner.post(`/api/jobs/${job.id}/transitions`).send({ to: 'on_bench' })).status).toBe(200);
    const rev1 = await upload(owner, job.id, rawImage(101), 'rev1.bin', { module: 'ECM', kind: 'revision' });
    expect(rev1.status).toBe(201);
    await approveAndSend(owner, job.id);
    expect((await jobRow(job.id)).state).toBe('with_customer');
    return { job, owner, rev1: rev1.body.data as { id: string; revisionNumber: number } };
  }

  it('a re-read equal to the revision sent matches it', async () => {
    const { job, owner, rev1 } = await sentJob();
    const customer = await signIn(t.app, await emailOf(job.customerUserId));
    // The same image in another format is the same calibration.
    const image = rawImage(101);
    const asHex = MemoryMap.fromPaddedUint8Array(new Uint8Array(image)).asHexString();
    const reRead = await upload(customer, job.id, Buffer.from(asHex), 'after-flash.hex', { module: 'ECM', kind: 're-read' });
    expect(reRead.status).toBe(201);
    const verify = await owner.get(`/api/files/${reRead.body.data.id}/verify`);
    expect(verify.body.data).toMatchObject({ status: 'matches', matchesRevision: rev1.revisionNumber, warning: false, foreignMatch: false });
    expect(verify.body.data.message).toBe(`Matches revision ${rev1.revisionNumber}.`);
  });

  it('a re-read that differs is shown with its ranges and a warning', async () => {
    const { job, owner } = await sentJob();
    const changed = rawImage(101);
    changed[10] = changed[10]! ^ 0xff;
    changed[11] = changed[11]! ^ 0xff;
    changed[400] = changed[400]! ^ 0x01;
    const reRead = await upload(owner, job.id, changed, 're-read.bin', { module: 'ECM', kind: 're_read' });
    const verify = (await owner.get(`/api/files/${reRead.body.data.id}/verify`)).body.data;
    // Two separate stretches: bytes 10–11, and byte 400, farther apart than the 16-byte merge gap [CALC].
    expect(verify).toMatchObject({ status: 'differs', warning: true, changedBytes: 3, totalRanges: 2 });
    expect(verify.ranges.map((r: { start: number; end: number }) => [r.start, r.end])).toEqual([[10, 12], [400, 401]]);
    expect(verify.message).toMatch(/^Differs from revision 1 in 2 ranges/);
    const timeline = (await owner.get(`/api/jobs/${job.id}`)).body.data.timeline.map((e: { text: string }) => e.text);
    expect(timeline.some((text: string) => text.startsWith('Re-read (ECM) uploaded, Raw binary: Differs from revision 1 in 2 ranges'))).toBe(true);
  });

  it('flags a read that matches a revision of another job in the shop, and only in that shop', async () => {
    const { owner } = await sentJob();
    const other = kestrelJob('intake', (j) => j.dealerId === null);
    const customer = await signIn(t.app, await emailOf(other.customerUserId));
    const read = await upload(customer, other.id, rawImage(101), 'stock.bin', { module: 'ECM', kind: 'read' });
    const verify = (await owner.get(`/api/files/${read.body.data.id}/verify`)).body.data;
    expect(verify.foreignMatch).toBe(true);
    expect(verify.warning).toBe(true);
    expect(verify.foreignMatches[0]).toMatchObject({ module: 'ECM', revisionNumber: 1 });

    const harborJob = seeded((j) => j.shopId === t.ids.harbor.shopId && j.state === 'intake');
    const harborCustomer = await signIn(t.app, await emailOf(harborJob.customerUserId));
    const harborRead = await upload(harborCustomer, harborJob.id, rawImage(101), 'stock.bin', { module: 'ECM', kind: 'read' });
    const harborOwner = await signIn(t.app, 'owner@harbor.test');
    expect((await harborOwner.get(`/api/files/${harborRead.body.data.id}/verify`)).body.data.foreignMatch).toBe(false);
  });
});

describe('diff', () => {
  it('reports changed ranges and bytes of two images of the same module, paged, with a hex view', async () => {
    const job = kestrelJob('intake', (j) => j.dealerId === null);
    const customer = await signIn(t.app, await emailOf(job.customerUserId));
    const a = rawImage(5);
    const b = Buffer.from(a);
    for (const at of [0, 1, 15, 100, 101, 102, 300]) b[at] = b[at]! ^ 0x55;
    const fa = (await upload(customer, job.id, a, 'a.bin', { module: 'ECM', kind: 'read' })).body.data.id;
    const fb = (await upload(customer, job.id, b, 'b.bin', { module: 'ECM', kind: 're_read' })).body.data.id;
    const ft = (await upload(customer, job.id, a, 't.bin', { module: 'TCM', kind: 'read' })).body.data.id;

    // Independent count: a plain byte loop over both buffers [CALC].
    const changed = [...a].filter((byte, i) => byte !== b[i]).length;
    const diff = (await customer.get(`/api/files/${fa}/diff/${fb}?gap=16`)).body.data;
    expect(diff.changedBytes).toBe(changed);
    expect(diff.changedShare).toBeCloseTo(changed / a.length, 12);
    // gap 16: 0–1 and 15 are 13 apart (one range); 100–102; 300 alone [CALC].
    expect(diff.ranges.map((r: { start: number; end: number }) => [r.start, r.end])).toEqual([[0, 16], [100, 103], [300, 301]]);
    const tight = (await customer.get(`/api/files/${fa}/diff/${fb}?gap=0&page=2&pageSize=2`)).body.data;
    expect(tight).toMatchObject({ page: 2, pageSize: 2, totalRanges: 4, pageCount: 2 });
    expect(tight.ranges.map((r: { start: number }) => r.start)).toEqual([100, 300]);

    const hex = (await customer.get(`/api/files/${fa}/diff/${fb}/hex?range=0x0-0x20`)).body.data;
    expect(hex.rows).toHaveLength(2);
    expect(hex.rows[0].left[0]).toBe(a[0]);
    expect(hex.rows[0].right[0]).toBe(b[0]);
    expect(hex.rows[0].changed.slice(0, 3)).toEqual([true, true, false]);

    const mixed = await customer.get(`/api/files/${fa}/diff/${ft}`);
    expect(mixed.status).toBe(400);
    expect(mixed.body.error.message).toMatch(/same module/);
    expect((await customer.get(`/api/files/${fa}/diff/${fb}/hex?range=0x20-0x10`)).status).toBe(400);
    const harbor = await signIn(t.app, 'owner@harbor.test');
    expect((await harbor.get(`/api/files/${fa}/diff/${fb}`)).status).toBe(404);
  });
});

describe('demo files', () => {
  it('seeds a read per package module and Rev 1..round for every job past intake, and a re-read that differs', async () => {
    const files = await t.db.selectFrom('calibration_files').selectAll().execute();
    expect(new Set(files.map((f) => f.format))).toEqual(new Set(['raw', 'intel_hex', 'srec']));
    for (const job of t.ids.jobs) {
      const row = await jobRow(job.id);
      const mine = files.filter((f) => f.job_id === job.id);
      if (row.has_stock_read === 0) {
        expect(mine).toEqual([]);
        continue;
      }
      for (const module of job.modules) {
        expect(mine.filter((f) => f.module === module && f.kind === 'read')).toHaveLength(1);
        const revisions = mine.filter((f) => f.module === module && f.kind === 'revision' && (f.for_round ?? 0) <= row.round).map((f) => f.revision_number);
        expect(revisions.sort()).toEqual(Array.from({ length: row.round }, (_, i) => i + 1));
        // A job whose next revision waits for approval has that one draft per module, and no other job has a draft.
        const drafts = mine.filter((f) => f.module === module && f.kind === 'revision' && (f.for_round ?? 0) > row.round);
        expect(drafts).toHaveLength(row.drafts_awaiting_approval > 0 ? 1 : 0);
      }
    }
    const reReads = files.filter((f) => f.kind === 're_read');
    const matchesARevision = (f: (typeof files)[number]) => files.some((r) => r.job_id === f.job_id && r.kind === 'revision' && r.crc32 === f.crc32);
    expect(reReads.filter(matchesARevision)).toHaveLength(1);
    const reRead = reReads.find((f) => !matchesARevision(f))!;
    const owner = await signIn(t.app, 'owner@kestrel.test');
    const verify = (await owner.get(`/api/files/${reRead.id}/verify`)).body.data;
    expect(verify).toMatchObject({ status: 'differs', warning: true });
    expect(verify.totalRanges).toBeGreaterThan(0);
  });
});
