import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { CANONICAL_CHANNELS } from '@revloop/domain/datalog';
import { KNOCKING_DRIVE, generateLog } from '@revloop/domain/datalog/testing';
import { appendLedgerEntry } from '@revloop/db';
import { createCustomer, createDealer, createJob, createMember, createShop, type TestJob } from '../../testing/factories';
import { createTestApp, signIn, type TestApp } from '../../testing/test-app';

type Agent = Awaited<ReturnType<typeof signIn>>;

let t: TestApp;
let scratch: string;
const jobs = new Map<string, TestJob>();
let dealerJobId: string;
let otherShopJobId: string;
/**
 * A shop whose customer has a job waiting for a log, one in log review and one dialed in; a dealer's customer's job on
 * the bench; and a second shop with a job in log review.
 */
beforeAll(async () => {
  t = await createTestApp();
  scratch = fs.mkdtempSync(path.join(os.tmpdir(), 'datalogs-api-'));
  const shop = await createShop(t, { ownerEmail: 'owner@bench.test' });
  const dealer = await createDealer(t, shop);
  await appendLedgerEntry(t.db, { shopId: shop.id, dealerId: dealer.id, kind: 'top_up', amountMinor: 500_000, currency: shop.currency, memo: 'Test top-up', at: t.clock.now().toISOString() });
  await createMember(t, shop, 'dealer', { email: 'dealer@bench.test', dealer });
  await createCustomer(t, shop, { email: 'riley.moss@bench.test' });
  const customer = await createCustomer(t, shop, { email: 'customer@bench.test', name: 'Jordan Hale' });
  for (const state of ['with_customer', 'log_review', 'dialed_in'] as const) jobs.set(state, await createJob(t, shop, { state, customer }));
  dealerJobId = (await createJob(t, shop, { state: 'on_bench', customer: await createCustomer(t, shop, { dealer }) })).id;
  const other = await createShop(t, { ownerEmail: 'owner@other.test' });
  await createMember(t, other, 'tuner', { email: 'tuner@other.test' });
  otherShopJobId = (await createJob(t, other, { state: 'log_review', customer: await createCustomer(t, other, { email: 'customer@other.test' }) })).id;
});
afterAll(async () => {
  await t.close();
  fs.rmSync(scratch, { recursive: true, force: true });
});

const drive = generateLog(KNOCKING_DRIVE).text;

/** The customer's job that was in `state` when the tests began. */
const customerJob = (state: 'with_customer' | 'log_review' | 'dialed_in') => jobs.get(state)!;

async function upload(agent: Agent, jobId: string, text: string | Buffer, name = 'drive.csv', map?: Record<string, string>) {
  const req = agent.post(`/api/jobs/${jobId}/datalogs`).attach('file', Buffer.isBuffer(text) ? text : Buffer.from(text), name);
  return map ? req.field('map', JSON.stringify(map)) : req;
}

/** Polls the log until the worker is done with it. */
async function settled(agent: Agent, id: string) {
  for (let i = 0; i < 200; i++) {
    const res = await agent.get(`/api/datalogs/${id}`);
    expect(res.status).toBe(200);
    expect(res.body.data.progress).toBeGreaterThanOrEqual(0);
    expect(res.body.data.progress).toBeLessThanOrEqual(1);
    if (res.body.data.status !== 'processing') return res.body.data;
    await new Promise((r) => setTimeout(r, 100));
  }
  throw new Error('analysis did not finish');
}

describe('datalog upload and report', () => {
  it('a customer uploads a log; it is analysed off the request, the job moves to log review and the tuner hears of it', async () => {
    const job = customerJob('with_customer');
    const customer = await signIn(t.app, 'customer@bench.test');
    const res = await upload(customer, job.id, drive);
    expect(res.status).toBe(202);
    expect(res.body.data).toMatchObject({ status: 'processing', round: job.round, originalName: 'drive.csv', uploadedBy: { name: 'Jordan Hale' } });

    const log = await settled(customer, res.body.data.id);
    expect(log.status).toBe('ready');
    expect(log.progress).toBe(1);
    const report = log.report;
    // DESIGN "Datalog report contract": every named field, with its shape.
    expect(Object.keys(report)).toEqual(expect.arrayContaining(['rows', 'durationS', 'sampleRateHz', 'channels', 'units', 'checks', 'fuelTrim', 'wot', 'knock', 'sensors']));
    expect(report.rows).toBe(drive.trimEnd().split('\n').length - 1);
    // [CALC] rows at 10 Hz: (rows − 1)/duration.
    expect(report.sampleRateHz).toBeCloseTo(10, 1);
    expect(report.checks.map((c: { id: string }) => c.id)).toEqual(['required_channels', 'engine_warm', 'full_throttle', 'wot_gears', 'sensor_sanity']);
    for (const check of report.checks) {
      expect(['pass', 'warn', 'fail']).toContain(check.status);
      expect(check.message.length).toBeGreaterThan(10);
    }
    expect(report.fuelTrim).toMatchObject({ rpmAxis: expect.any(Array), mapAxis: expect.any(Array), cells: expect.any(Array) });
    expect(report.wot.pulls).toHaveLength(1);
    expect(report.wot.pulls[0]).toMatchObject({ gears: [3], lambdaError: expect.any(Array) });
    expect(report.knock.events).toHaveLength(1);
    expect(report.knock.maxRetardDeg).toBeGreaterThan(0);
    expect(Object.keys(report.channels).every((c) => (CANONICAL_CHANNELS as readonly string[]).includes(c))).toBe(true);

    const after = await customer.get(`/api/jobs/${job.id}`);
    expect(after.body.data.state).toBe('log_review');
    expect(after.body.data.facts.hasLogForRound).toBe(true);
    expect(after.body.data.timeline.map((e: { text: string }) => e.text)).toEqual(
      expect.arrayContaining([`Log drive.csv uploaded (on revision ${job.round})`, expect.stringMatching(/^Log drive\.csv checked: /)]),
    );
    const tunerNotices = await t.db.selectFrom('notifications').select(['user_id', 'kind']).where('job_id', '=', job.id).where('kind', '=', 'log_received').execute();
    expect(tunerNotices.length).toBeGreaterThan(0);

    const list = await customer.get(`/api/jobs/${job.id}/datalogs`);
    expect(list.body.data[0]).toMatchObject({ id: log.id, status: 'ready', checks: report.checks });
  });

  it('serves chart series downsampled to the requested points, knock markers and CSV exports', async () => {
    const job = customerJob('log_review');
    const tuner = await signIn(t.app, 'owner@bench.test');
    const { id } = (await upload(tuner, job.id, drive)).body.data;
    const log = await settled(tuner, id);
    const series = await tuner.get(`/api/datalogs/${id}/series?channels=rpm,map,knock_retard&points=300`);
    expect(series.status).toBe(200);
    expect(series.body.data.channels.map((c: { channel: string }) => c.channel)).toEqual(['rpm', 'map', 'knock_retard']);
    for (const c of series.body.data.channels) {
      expect(c.t.length).toBeLessThanOrEqual(300);
      expect(c.t.length).toBe(c.v.length);
      // LTTB keeps the first and last sample of the range.
      expect(c.t[0]).toBe(0);
      expect(c.t.at(-1)).toBeCloseTo(log.report.durationS, 1);
    }
    // LTTB keeps the burst visible but need not keep its exact peak: the chart's knock markers come from the report.
    expect(Math.max(...series.body.data.channels[2].v)).toBeGreaterThan(0);
    expect(series.body.data.knock).toHaveLength(1);
    const window = await tuner.get(`/api/datalogs/${id}/series?channels=rpm&from=100&to=110&points=2000`);
    // [CALC] 10 s at 10 Hz is 101 samples, fewer than asked for, so all are returned.
    expect(window.body.data.channels[0].t).toHaveLength(101);
    expect((await tuner.get(`/api/datalogs/${id}/series?channels=bogus`)).status).toBe(400);
    expect((await tuner.get(`/api/datalogs/${id}/series?channels=rpm&sampling=every`)).status).toBe(400);

    // Scatter plots pair channels row by row: every channel comes back on the same time stamps.
    const rows = await tuner.get(`/api/datalogs/${id}/series?channels=rpm,map,knock_retard&sampling=rows&points=500`);
    expect(rows.status).toBe(200);
    expect(rows.body.data.sampling).toBe('rows');
    const [rpm, map, knock] = rows.body.data.channels;
    expect(rpm.t).toEqual(map.t);
    expect(rpm.t).toEqual(knock.t);
    expect(rpm.t.length).toBeLessThanOrEqual(500);
    expect(rpm.v).toHaveLength(rpm.t.length);
    // [CALC] the log has rows × 1/rate seconds; an even stride of ceil(rows / 500) rows keeps at least 250 of them.
    expect(rpm.t.length).toBeGreaterThanOrEqual(250);
    const stride = Math.ceil(log.report.rows / 500);
    expect(rpm.t[1] - rpm.t[0]).toBeCloseTo(stride / log.report.sampleRateHz, 3);
    // Unthinned in a short window: [CALC] 10 s at 10 Hz is 101 rows, each paired with the same row of MAP.
    const rowWindow = await tuner.get(`/api/datalogs/${id}/series?channels=rpm,map&sampling=rows&from=100&to=110`);
    expect(rowWindow.body.data.channels[0].t).toHaveLength(101);
    expect(rowWindow.body.data.channels[1].t).toEqual(rowWindow.body.data.channels[0].t);

    const trims = await tuner.get(`/api/datalogs/${id}/export/trims.csv`);
    expect(trims.status).toBe(200);
    expect(trims.headers['content-type']).toMatch(/text\/csv/);
    expect(trims.text.split('\n')[0]).toMatch(/^"?rpm \\ MAP kPa/);
    const wot = await tuner.get(`/api/datalogs/${id}/export/wot.csv`);
    expect(wot.text.split('\n')[0]).toContain('fuel_correction_pct');
  });

  it('compares two logs of one job and refuses logs of different jobs', async () => {
    const job = customerJob('log_review');
    const owner = await signIn(t.app, 'owner@bench.test');
    const lean = generateLog({ rateHz: 10, warmupS: 320, cruiseS: 90, pulls: [{ gears: [3] }], leanWot: { aboveRpm: 0, errorPct: 6 }, gearChannel: true }).text;
    const a = await settled(owner, (await upload(owner, job.id, drive, 'before.csv')).body.data.id);
    const b = await settled(owner, (await upload(owner, job.id, lean, 'after.csv')).body.data.id);
    const cmp = await owner.get(`/api/datalogs/${a.id}/compare/${b.id}`);
    expect(cmp.status).toBe(200);
    expect(cmp.body.data.base.id).toBe(a.id);
    const bins = cmp.body.data.lambdaError.filter((bin: { deltaPct: number | null }) => bin.deltaPct !== null);
    expect(bins.length).toBeGreaterThan(0);
    // [CALC] 6 % leaner measured λ at the same commanded λ: error grows by about 6 points.
    for (const bin of bins) expect(bin.deltaPct).toBeGreaterThan(4);
    const otherJob = customerJob('with_customer');
    const c = (await upload(owner, otherJob.id, drive, 'elsewhere.csv')).body.data.id;
    expect((await owner.get(`/api/datalogs/${a.id}/compare/${c}`)).status).toBe(400);
  });
});

describe('datalog access', () => {
  it('lets whoever reads the job read its logs; others in the shop and other shops get 404', async () => {
    const job = customerJob('log_review');
    const owner = await signIn(t.app, 'owner@bench.test');
    const { id } = (await upload(owner, job.id, drive)).body.data;
    await settled(owner, id);
    expect((await (await signIn(t.app, 'customer@bench.test')).get(`/api/datalogs/${id}`)).status).toBe(200);
    for (const email of ['riley.moss@bench.test', 'dealer@bench.test', 'owner@other.test', 'tuner@other.test', 'customer@other.test']) {
      const agent = await signIn(t.app, email);
      expect((await agent.get(`/api/datalogs/${id}`)).status, email).toBe(404);
      expect((await agent.get(`/api/datalogs/${id}/series?channels=rpm`)).status, email).toBe(404);
      expect((await agent.get(`/api/datalogs/${id}/export/trims.csv`)).status, email).toBe(404);
      expect((await agent.get(`/api/jobs/${job.id}/datalogs`)).status, email).toBe(404);
      expect((await upload(agent, job.id, drive)).status, email).toBe(404);
    }
    expect((await (await signIn(t.app, 'owner@other.test')).put(`/api/datalogs/${id}/mapping`).send({ channels: {} })).status).toBe(404);
  });

  it('lets a dealer upload for the dealer’s own customer, and refuses logs on a finished job', async () => {
    const dealerJob = { id: dealerJobId };
    const dealer = await signIn(t.app, 'dealer@bench.test');
    expect((await upload(dealer, dealerJob.id, drive)).status).toBe(202);
    const done = customerJob('dialed_in');
    const owner = await signIn(t.app, 'owner@bench.test');
    const refused = await upload(owner, done.id, drive);
    expect(refused.status).toBe(409);
  });
});

describe('bad input gets a clear error and stores nothing', () => {
  const tempFiles = () => fs.readdirSync(t.blobs.tempDir);
  const rowCount = async () => Number((await t.db.selectFrom('datalogs').select((eb) => eb.fn.countAll().as('n')).executeTakeFirstOrThrow()).n);

  it.each([
    ['binary', Buffer.from([0x7f, 0x45, 0x4c, 0x46, 0, 1, 2, 0, 0, 0, 255, 254]), 'binary data'],
    ['empty', Buffer.alloc(0), 'The file is empty.'],
    ['header only', Buffer.from('Time (s),Engine RPM,MAP (kPa)\n'), 'header row but no data rows'],
  ])('%s file → 422', async (_name, bytes, message) => {
    const owner = await signIn(t.app, 'owner@bench.test');
    const before = await rowCount();
    const res = await upload(owner, customerJob('log_review').id, bytes, 'x.csv');
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('invalid_datalog');
    expect(res.body.error.message).toContain(message);
    expect(await rowCount()).toBe(before);
    expect(tempFiles()).toEqual([]);
  });

  it('no file → 400; a map naming a missing column → 400', async () => {
    const owner = await signIn(t.app, 'owner@bench.test');
    const job = customerJob('log_review');
    const none = await owner.post(`/api/jobs/${job.id}/datalogs`).field('note', 'x');
    expect(none.status).toBe(400);
    expect(none.body.error.message).toMatch(/Choose a CSV log file/);
    const badMap = await upload(owner, job.id, drive, 'd.csv', { rpm: 'No such column' });
    expect(badMap.status).toBe(400);
    expect(badMap.body.error.message).toMatch(/no column "No such column"/);
    expect(tempFiles()).toEqual([]);
  });

  it('a 200 MB file is refused at the shop limit with 413 and leaves nothing behind', async () => {
    const owner = await signIn(t.app, 'owner@bench.test');
    const big = path.join(scratch, 'big.csv');
    const fd = fs.openSync(big, 'w');
    const block = Buffer.alloc(1024 * 1024, '1000,2000,3000\n');
    for (let i = 0; i < 200; i++) fs.writeSync(fd, block);
    fs.closeSync(fd);
    const before = await rowCount();
    const res = await owner.post(`/api/jobs/${customerJob('log_review').id}/datalogs`).attach('file', big);
    expect(res.status).toBe(413);
    expect(res.body.error).toMatchObject({ code: 'payload_too_large', message: expect.stringContaining('16 MiB') });
    expect(await rowCount()).toBe(before);
    expect(tempFiles()).toEqual([]);
  });
});

describe('header mapping', () => {
  // "Motor speed" matches no rpm synonym: the tuner maps it by hand once.
  const oddHeaders = drive.replace('Engine RPM (rpm)', 'Motor speed (rpm)');

  it('is confirmed once, re-analyses the log, and is remembered for this shop only', async () => {
    expect(oddHeaders).not.toBe(drive);
    const tuner = await signIn(t.app, 'owner@bench.test');
    const job = customerJob('log_review');
    const first = await settled(tuner, (await upload(tuner, job.id, oddHeaders, 'odd.csv')).body.data.id);
    expect(first.report.channels.rpm).toBeUndefined();
    const mapping = await tuner.get(`/api/datalogs/${first.id}/mapping`);
    expect(mapping.body.data).toMatchObject({ remembered: false });
    expect(mapping.body.data.headers).toContain('Motor speed (rpm)');

    const put = await tuner.put(`/api/datalogs/${first.id}/mapping`).send({ channels: { rpm: 'Motor speed (rpm)' } });
    expect(put.status).toBe(200);
    expect(put.body.data.status).toBe('processing');
    const again = await settled(tuner, first.id);
    expect(again.report.channels.rpm).toBe('Motor speed (rpm)');
    expect((await tuner.get(`/api/datalogs/${first.id}/mapping`)).body.data.remembered).toBe(true);

    const second = await settled(tuner, (await upload(tuner, job.id, oddHeaders, 'odd-2.csv')).body.data.id);
    expect(second.report.channels.rpm).toBe('Motor speed (rpm)');

    const harborJob = { id: otherShopJobId };
    const harbor = await signIn(t.app, 'owner@other.test');
    const elsewhere = await settled(harbor, (await upload(harbor, harborJob.id, oddHeaders, 'odd.csv')).body.data.id);
    expect(elsewhere.report.channels.rpm).toBeUndefined();
  });

  it('keeps stated units and the AFR scale, and remembers them with the columns', async () => {
    const owner = await signIn(t.app, 'owner@bench.test');
    const job = customerJob('log_review');
    const psiHeaders = drive.replace('Intake manifold absolute pressure (kPa)', 'Manifold P');
    const log = await settled(owner, (await upload(owner, job.id, psiHeaders, 'psi.csv')).body.data.id);
    const mapping = (await owner.get(`/api/datalogs/${log.id}/mapping`)).body.data;
    expect(mapping.canonical.find((c: { channel: string }) => c.channel === 'map').unitChoices).toContainEqual({ value: 'psia', label: 'psi absolute' });
    expect(mapping).toMatchObject({ stated: {}, afrScale: null });

    const put = await owner
      .put(`/api/datalogs/${log.id}/mapping`)
      .send({ channels: { map: 'Manifold P' }, units: { map: 'kPa abs', rpm: '' }, afrScale: 'gasoline' });
    expect(put.status).toBe(200);
    const again = await settled(owner, log.id);
    expect(again.report.units.map).toBe('kPa (stated)');
    expect(again.report.afrScale).toMatchObject({ scale: 'gasoline', stated: true });
    expect((await owner.get(`/api/datalogs/${log.id}/mapping`)).body.data).toMatchObject({ stated: { map: 'kPa abs' }, afrScale: 'gasoline' });

    const next = await settled(owner, (await upload(owner, job.id, psiHeaders, 'psi-2.csv')).body.data.id);
    expect(next.report.units.map).toBe('kPa (stated)');
    expect(next.report.afrScale.stated).toBe(true);

    const bad = await owner.put(`/api/datalogs/${log.id}/mapping`).send({ channels: {}, units: { map: '°F' } });
    expect(bad.status).toBe(400);
    const badScale = await owner.put(`/api/datalogs/${log.id}/mapping`).send({ channels: {}, afrScale: 'petrol' });
    expect(badScale.status).toBe(400);
  });

  it('takes stated units with the upload', async () => {
    const owner = await signIn(t.app, 'owner@bench.test');
    const res = await owner
      .post(`/api/jobs/${customerJob('log_review').id}/datalogs`)
      .attach('file', Buffer.from(drive.replace('Intake manifold absolute pressure (kPa)', 'Manifold Q')), 'q.csv')
      .field('map', JSON.stringify({ map: 'Manifold Q' }))
      .field('units', JSON.stringify({ map: 'kPa abs' }));
    expect(res.status).toBe(202);
    const log = await settled(owner, res.body.data.id);
    expect(log.report.units.map).toBe('kPa (stated)');
    expect(log.report.unmapped).toEqual([]);
  });

  it('refuses a mapping that names a column the log does not have', async () => {
    const owner = await signIn(t.app, 'owner@bench.test');
    const log = await settled(owner, (await upload(owner, customerJob('log_review').id, drive)).body.data.id);
    const res = await owner.put(`/api/datalogs/${log.id}/mapping`).send({ channels: { rpm: 'Nope' } });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation');
  });
});
