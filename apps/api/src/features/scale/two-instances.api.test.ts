import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { createDb, type Db } from '@revloop/db';
import { testDbUrl, testEngine } from '@revloop/db/testing';
import { sql, type RawBuilder } from 'kysely';
import Stripe from 'stripe';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { generateLog } from '@revloop/domain/datalog/testing';
import { createJob, createMember, createShop, payJob } from '../../testing/factories';
import { createTestApp, TEST_PASSWORD } from '../../testing/test-app';
import { DiskBlobStore } from '../../storage/blob-store';
import { S3BlobStore } from '../../storage/s3-blob-store';
import { kill, serverEnv, waitFor } from '../../testing/child-processes';
import { freePort } from '../../testing/free-port';
import { startLocalS3, type LocalS3 } from '../../testing/s3-server';
import { fileLinkQuery } from '../files/file-links';

// Two real API processes on different ports share one database (a SQLite file in WAL mode, or in the api-pg project a
// PostgreSQL database) and one object store (s3rver through the AWS SDK); each has its own data folder, so nothing is
// shared through local disk.

const ROOT = fileURLToPath(new URL('../../../../../', import.meta.url));
const SERVER = path.join(ROOT, 'apps/api/src/server.ts');
const WEBHOOK_SECRET = 'whsec_two_instances';

let s3: LocalS3;
let workDir: string;
/** The shared database: a SQLite file, or a PostgreSQL address. */
let dbSource: string;
let reader: Db;
let shopId: string;
let ownerEmail: string;
let tunerEmail: string;
let jobIds: string[];
const children: ChildProcess[] = [];

async function startInstance(name: string) {
  const port = await freePort();
  const dataDir = path.join(workDir, name);
  fs.mkdirSync(dataDir, { recursive: true });
  const proc = spawn(process.execPath, ['--import', 'tsx', SERVER], {
    cwd: ROOT,
    env: serverEnv(port, dataDir, {
      ...(testEngine() === 'postgres' ? { DATABASE_URL: dbSource } : { SQLITE_FILE: dbSource }),
      STRIPE_WEBHOOK_SECRET: WEBHOOK_SECRET,
      LOG_LEVEL: 'warn',
      ...s3.env,
    }),
    stdio: ['ignore', 'ignore', 'pipe'],
  });
  children.push(proc);
  let stderr = '';
  proc.stderr!.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
  const base = `http://127.0.0.1:${port}`;
  await waitFor(`instance ${name} to answer`, async () => {
    if (proc.exitCode !== null) throw new Error(`instance ${name} exited ${proc.exitCode}: ${stderr}`);
    return fetch(`${base}/api/health`).then((r) => (r.ok ? true : undefined), () => undefined);
  });
  return { proc, base };
}

const signIn = (base: string, email: string, password = TEST_PASSWORD) =>
  fetch(`${base}/api/auth/sign-in`, { method: 'POST', headers: { 'content-type': 'application/json', origin: base }, body: JSON.stringify({ email, password }) });

async function upload(base: string, cookie: string, route: string, file: Buffer, name: string, fields: Record<string, string> = {}) {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  form.set('file', new Blob([file]), name);
  const res = await fetch(`${base}${route}`, { method: 'POST', headers: { cookie, origin: base }, body: form });
  if (res.status < 200 || res.status >= 300) {
    refusals.push(`${route} ${res.status} ${await res.text()}`);
    return undefined;
  }
  return ((await res.json()) as { data: { id: string; sha256: string; status?: string } }).data;
}

/** Uploads answered otherwise, to explain a failed expectation. */
const refusals: string[] = [];

const readDb = async <T>(query: RawBuilder<T>): Promise<T[]> => (await query.execute(reader)).rows;

beforeAll(async () => {
  s3 = await startLocalS3();
  workDir = fs.mkdtempSync(path.join(os.tmpdir(), 'revloop-two-'));
  // The shared database as the server keeps it: migrated, then one shop, a tuner and open jobs made by the factories
  // (one sent and paid, so its customer's download link opens).
  const seedDir = path.join(workDir, 'seed');
  fs.mkdirSync(seedDir, { recursive: true });
  const t = await createTestApp({}, { dataDir: seedDir });
  try {
    dbSource = testEngine() === 'postgres' ? testDbUrl(t.db) : path.join(seedDir, 'revloop.db');
    const shop = await createShop(t);
    shopId = shop.id;
    ownerEmail = shop.owner.email;
    tunerEmail = (await createMember(t, shop, 'tuner')).email;
    jobIds = [];
    for (const state of ['on_bench', 'with_customer'] as const) {
      const job = await createJob(t, shop, { state });
      if (state === 'with_customer') await payJob(t, job);
      jobIds.push(job.id);
    }
  } finally {
    await t.close();
  }
  reader = createDb(dbSource, { poolSize: 1 });
  const seedBlobs = new DiskBlobStore(seedDir);
  // The files go to the shared bucket, as moving an install from disk to object storage would.
  const bucket = new S3BlobStore(path.join(workDir, 'seed'), { bucket: s3.bucket, region: 'us-east-1', endpoint: s3.endpoint, accessKeyId: s3.accessKeyId, secretAccessKey: s3.secretAccessKey, forcePathStyle: true });
  for await (const blob of seedBlobs.list()) await bucket.putBytes(await seedBlobs.read(blob.sha256));
  bucket.client.destroy();
}, 120_000);

afterAll(async () => {
  for (const child of children) await kill(child, 'SIGKILL');
  await s3.close();
  await reader?.destroy();
  fs.rmSync(workDir, { recursive: true, force: true });
});

it('two instances on one database and one object store behave as one', { timeout: 240_000 }, async () => {
  const [a, b] = await Promise.all([startInstance('a'), startInstance('b')]);

  // A session made on one works on the other.
  const signedIn = await signIn(a.base, ownerEmail);
  expect(signedIn.status).toBe(200);
  const cookie = signedIn.headers.getSetCookie().find((c) => c.startsWith('revloop_session='))!.split(';')[0]!;
  const me = await fetch(`${b.base}/api/me`, { headers: { cookie } });
  expect(me.status).toBe(200);

  // Throttling counts attempts made on both: five wrong passwords for one account from one address (three on A,
  // two on B) use up that pair's budget, so the sixth is refused on either instance.
  const wrong = [a, a, a, b, b].map((i) => i.base);
  for (const base of wrong) expect((await signIn(base, tunerEmail, 'not-the-password')).status).toBe(401);
  const sixth = await signIn(b.base, tunerEmail, 'not-the-password');
  expect(sixth.status).toBe(429);
  expect((await signIn(a.base, tunerEmail, 'not-the-password')).status).toBe(429);

  // A webhook delivered to both takes effect once: the event id is claimed in the shared database.
  const stripe = new Stripe('sk_test_two_instances');
  const eventId = `evt_two_${randomBytes(4).toString('hex')}`;
  const body = JSON.stringify({ id: eventId, object: 'event', type: 'customer.created', created: 1, data: { object: { id: 'cus_two', object: 'customer' } } });
  const deliver = (base: string) =>
    fetch(`${base}/api/stripe/webhook`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'stripe-signature': stripe.webhooks.generateTestHeaderString({ payload: body, secret: WEBHOOK_SECRET }) },
      body,
    });
  const deliveries = await Promise.all([deliver(a.base), deliver(b.base), deliver(a.base), deliver(b.base)]);
  expect(deliveries.map((r) => r.status)).toEqual([200, 200, 200, 200]);
  expect((await readDb(sql<{ n: number }>`select count(*) as n from stripe_events where id = ${eventId}`))[0]!.n).toBe(1);

  // A log uploaded through one is analysed once and visible through the other.
  const open = jobIds.map((id) => ({ id }));
  const log = Buffer.from(generateLog({ rateHz: 20, warmupS: 60, cruiseS: 60, pulls: [{ gears: [3] }], gearChannel: true }).text);
  const uploaded = await upload(a.base, cookie, `/api/jobs/${open[0]!.id}/datalogs`, log, 'two-instances.csv');
  expect(uploaded?.status).toBe('processing');
  const seen = await waitFor('the log to be analysed', async () => {
    const res = await fetch(`${b.base}/api/jobs/${open[0]!.id}/datalogs`, { headers: { cookie } });
    const row = ((await res.json()) as { data: { id: string; status: string }[] }).data.find((d) => d.id === uploaded!.id);
    return row && row.status !== 'processing' ? row : undefined;
  });
  expect(seen.status).toBe('ready');
  // The row turns ready just before its queue job is marked done: one job, one attempt. On PostgreSQL the queue is
  // pg-boss (schema pgboss), on SQLite the table queue.
  const jobs = await waitFor('the analysis job to end', async () => {
    const rows =
      testEngine() === 'postgres'
        ? await readDb(sql<{ state: string; attempts: number }>`select state::text as state, retry_count + 1 as attempts from pgboss.job where name = 'datalog-analysis' and singleton_key = ${uploaded!.id}`)
        : await readDb(sql<{ state: string; attempts: number }>`select state, attempts from queue_jobs where queue = 'datalog-analysis' and key = ${uploaded!.id}`);
    return rows.every((r) => ['done', 'completed', 'failed'].includes(r.state)) ? rows : undefined;
  });
  expect(jobs).toEqual([{ state: testEngine() === 'postgres' ? 'completed' : 'done', attempts: 1 }]);
  const analysed = await readDb(sql<{ n: number }>`select count(*) as n from audit_events where action = 'datalog.analysed' and details like ${`%${uploaded!.id}%`}`);
  expect(analysed[0]!.n).toBe(1);

  // A download signed by one verifies on the other: both read the link key from shared_secrets, and the bytes come
  // from the shared bucket whichever instance stored them. A link opens what the job's customer may read.
  expect(await upload(b.base, cookie, `/api/jobs/${open[1]!.id}/files`, randomBytes(32 * 1024), 'shared.bin', { module: 'ECM', kind: 're-read' }), refusals.join('\n')).toBeDefined();
  const [secret] = await readDb(sql<{ value: string }>`select value from shared_secrets where name = 'file-link'`);
  const candidates = await readDb(sql<{ id: string; size_bytes: number }>`select id, size_bytes from calibration_files where shop_id = ${shopId} order by created_at desc`);
  const linkOf = (id: string) => `/api/files/${id}/download?${fileLinkQuery(secret!.value, shopId, id, new Date())}`;
  let linked: { id: string; size_bytes: number } | undefined;
  for (const c of candidates) {
    if ((await fetch(`${a.base}${linkOf(c.id)}`)).status === 200) {
      linked = c;
      break;
    }
  }
  expect(linked, 'a file the customer may read by link').toBeDefined();
  const viaB = await fetch(`${b.base}${linkOf(linked!.id)}`);
  expect(viaB.status).toBe(200);
  expect((await viaB.arrayBuffer()).byteLength).toBe(linked!.size_bytes);
  const tampered = await fetch(`${b.base}${linkOf(linked!.id).replace(/sig=[^&]+/, 'sig=AAAA')}`);
  expect(tampered.status).not.toBe(200);

  // Killing one mid-upload loses no acknowledged write: every upload A answered is whole on B afterwards.
  const acknowledged: { id: string; sha256: string }[] = [];
  const inFlight = Array.from({ length: 8 }, (_, i) =>
    upload(a.base, cookie, `/api/jobs/${open[i % open.length]!.id}/files`, randomBytes(256 * 1024), `kill-${i}.bin`, { module: 'ECM', kind: 're-read' })
      .then((f) => (f ? acknowledged.push(f) : undefined))
      .catch(() => undefined),
  );
  await waitFor('a first acknowledged upload', () => (acknowledged.length > 0 ? true : undefined));
  await kill(a.proc, 'SIGKILL');
  await Promise.all(inFlight);
  expect(acknowledged.length).toBeGreaterThan(0);
  for (const f of acknowledged) {
    const res = await fetch(`${b.base}/api/files/${f.id}/download`, { headers: { cookie } });
    expect(res.status, f.id).toBe(200);
    expect((await res.arrayBuffer()).byteLength).toBe(256 * 1024);
  }
  await kill(b.proc, 'SIGTERM');
});
