import { spawn, type ChildProcess } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import fs from 'node:fs';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { createDb, type Db } from '@revloop/db';
import { testDbUrl, testEngine } from '@revloop/db/testing';
import { sql, type RawBuilder } from 'kysely';
import { afterAll, beforeAll, expect, it } from 'vitest';
import { generateLog } from '@revloop/domain/datalog/testing';
import { DiskBlobStore } from '../../storage/blob-store';
import { createJob, createShop } from '../../testing/factories';
import { kill, serverEnv, waitFor } from '../../testing/child-processes';
import { freePort } from '../../testing/free-port';
import { createTestApp, TEST_PASSWORD } from '../../testing/test-app';

// The real server in a child process, killed with SIGKILL in the middle of uploads and log checks, then started again
// on the same data folder. Waits are generous and every step waits for an observed fact, never for a fixed time.
// Which upload the kill cuts is left to chance, so nothing below depends on it: every upload the server acknowledged
// must have its row and its file, no temp file may stay, and every log must end ready or failed. What recovery must
// find is made certain instead: an upload stalled half-way, a log whose check was cut off, a file without a row.
// In the api-crash-pg project the database is PostgreSQL (the test file's copy of the migrated template) and the
// files stay on disk in the data folder; the checks are the same. They read rows and files only, never the queue's
// own tables, so they hold whichever queue the server runs.

const ROOT = fileURLToPath(new URL('../../../../../', import.meta.url));
const SERVER = path.join(ROOT, 'apps/api/src/server.ts');

let dataDir: string;
/** The database the servers run on: the data folder's SQLite file, or a PostgreSQL address. */
let dbSource: string;
/** One connection of the test's own to that database, outside the app: on PostgreSQL no shop is named, so row-level security hides nothing. */
let db: Db | undefined;
let ownerEmail: string;
/** Open jobs, one in each state before the first revision is judged. */
let jobIds: string[];
let child: ChildProcess | undefined;

/** Starts the server on the data folder and resolves once it answers, with its log lines so far (and to come). */
async function startServer(port: number) {
  const lines: string[] = [];
  const proc = spawn(process.execPath, ['--import', 'tsx', SERVER], {
    cwd: ROOT,
    env: serverEnv(port, dataDir, { LOG_LEVEL: 'info', ...(testEngine() === 'postgres' && { DATABASE_URL: dbSource }) }),
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  child = proc;
  let buffered = '';
  proc.stdout!.on('data', (chunk: Buffer) => {
    buffered += chunk.toString();
    const parts = buffered.split('\n');
    buffered = parts.pop()!;
    lines.push(...parts);
  });
  let stderr = '';
  proc.stderr!.on('data', (chunk: Buffer) => (stderr += chunk.toString()));
  const base = `http://127.0.0.1:${port}`;
  await waitFor('the server to answer', async () => {
    if (proc.exitCode !== null) throw new Error(`server exited ${proc.exitCode}: ${stderr}`);
    return fetch(`${base}/api/health`).then((r) => (r.ok ? true : undefined), () => undefined);
  });
  return { proc, base, lines };
}

async function signInCookie(base: string, email: string): Promise<string> {
  const res = await fetch(`${base}/api/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json', origin: base },
    body: JSON.stringify({ email, password: TEST_PASSWORD }),
  });
  if (res.status !== 200) throw new Error(`sign-in answered ${res.status}`);
  return res.headers.getSetCookie().find((c) => c.startsWith('revloop_session='))!.split(';')[0]!;
}

/** Uploads the server refused or that failed in transit, to explain a failed expectation. */
const refusals: string[] = [];

interface Acknowledged {
  table: 'calibration_files' | 'datalogs';
  id: string;
  sha256: string;
}

/**
 * A POST on a connection of its own. fetch would reuse a kept-alive connection, and when the server closes an idle one
 * just as a large body starts on it the write fails (EPIPE) although the server did nothing wrong.
 */
function postOnNewConnection(url: string, headers: Record<string, string>, body: Buffer): Promise<{ status: number; text: string }> {
  return new Promise((resolve, reject) => {
    const req = http.request(url, { method: 'POST', agent: false, headers: { ...headers, 'content-length': String(body.length) } }, (res) => {
      const chunks: Buffer[] = [];
      res.on('data', (chunk: Buffer) => chunks.push(chunk));
      res.on('end', () => resolve({ status: res.statusCode ?? 0, text: Buffer.concat(chunks).toString() }));
      res.on('error', reject);
    });
    req.on('error', reject);
    req.end(body);
  });
}

/** One multipart upload; resolves with the row the server acknowledged, or undefined when it answered otherwise or died. */
async function upload(base: string, cookie: string, route: string, file: Buffer, name: string, fields: Record<string, string>): Promise<Acknowledged | undefined> {
  const form = new FormData();
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  form.set('file', new Blob([file]), name);
  // The multipart body and its boundary as fetch would send them.
  const encoded = new Request(base, { method: 'POST', body: form });
  try {
    const body = Buffer.from(await encoded.arrayBuffer());
    const res = await postOnNewConnection(`${base}${route}`, { cookie, origin: base, 'content-type': encoded.headers.get('content-type')! }, body);
    if (res.status < 200 || res.status >= 300) {
      refusals.push(`${route} ${res.status} ${res.text}`);
      return undefined;
    }
    const answer = JSON.parse(res.text) as { data: { id: string; sha256: string } };
    return { table: route.endsWith('/datalogs') ? 'datalogs' : 'calibration_files', id: answer.data.id, sha256: answer.data.sha256 };
  } catch (error) {
    refusals.push(`${route} ${String(error)}`);
    return undefined;
  }
}

/** An upload that sends half its body and then stalls, so its temp file is on disk when the server dies. */
function stalledUpload(base: string, cookie: string, jobId: string): http.ClientRequest {
  const boundary = 'revloop-crash-test';
  const url = new URL(`${base}/api/jobs/${jobId}/files`);
  const req = http.request(url, {
    method: 'POST',
    headers: { cookie, origin: base, 'content-type': `multipart/form-data; boundary=${boundary}`, 'content-length': String(4 * 1024 * 1024) },
  });
  req.on('error', () => undefined);
  req.write(`--${boundary}\r\nContent-Disposition: form-data; name="module"\r\n\r\nECM\r\n`);
  req.write(`--${boundary}\r\nContent-Disposition: form-data; name="kind"\r\n\r\nre-read\r\n`);
  req.write(`--${boundary}\r\nContent-Disposition: form-data; name="file"; filename="slow.bin"\r\nContent-Type: application/octet-stream\r\n\r\n`);
  req.write(randomBytes(256 * 1024));
  return req;
}

// 100 Hz (about 56,000 rows): long enough a check that the kill still finds some unfinished, now that a warm thread takes a small log in tens of milliseconds.
const driveLog = (seed: number) =>
  Buffer.from(generateLog({ rateHz: 100, warmupS: 320 + seed, cruiseS: 240, pulls: [{ gears: [3] }], gearChannel: true }).text);

beforeAll(async () => {
  // The data folder as the server keeps it: the database migrated, then one shop and its jobs made by the factories.
  dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'revloop-crash-'));
  const t = await createTestApp({}, { dataDir });
  try {
    dbSource = testEngine() === 'postgres' ? testDbUrl(t.db) : path.join(dataDir, 'revloop.db');
    const shop = await createShop(t);
    ownerEmail = shop.owner.email;
    jobIds = [];
    for (const state of ['intake', 'ready', 'on_bench', 'with_customer'] as const) jobIds.push((await createJob(t, shop, { state })).id);
  } finally {
    await t.close();
  }
}, 60_000);

afterAll(async () => {
  if (child) await kill(child, 'SIGKILL');
  await db?.destroy();
  fs.rmSync(dataDir, { recursive: true, force: true });
});

it('a server killed mid-upload and mid-check comes back whole: no lost upload, no temp file, every log checked', { timeout: 180_000 }, async () => {
  const port = await freePort();
  const first = await startServer(port);
  // The server runs on the engine of this project.
  expect(await (await fetch(`${first.base}/api/health/ready`)).json()).toEqual({ status: 'ok', database: testEngine() });
  const cookie = await signInCookie(first.base, ownerEmail);
  const jobAt = (i: number) => jobIds[i % jobIds.length]!;

  const stalled = stalledUpload(first.base, cookie, jobAt(0));
  const tempDir = path.join(dataDir, 'tmp');
  await waitFor('the stalled upload to reach the temp folder', () => (fs.readdirSync(tempDir).length > 0 ? true : undefined));

  // A first round of uploads, one after another, is answered in full; a second, all at once, is in flight when the process dies.
  const uploadNo = (i: number) =>
    i % 2 === 0
      ? upload(first.base, cookie, `/api/jobs/${jobAt(i)}/datalogs`, driveLog(i), `drive-${i}.csv`, {})
      : upload(first.base, cookie, `/api/jobs/${jobAt(i)}/files`, randomBytes(64 * 1024), `read-${i}.bin`, { module: 'ECM', kind: 're-read' });
  const acknowledged: Acknowledged[] = [];
  for (let i = 0; i < 6; i++) {
    const answer = await uploadNo(i);
    if (answer) acknowledged.push(answer);
  }
  // Every job is open, so the server takes all of the first round.
  expect(acknowledged.length, refusals.join('\n')).toBe(6);
  const inFlight = Array.from({ length: 6 }, (_, k) => uploadNo(6 + k).then((a) => (a ? acknowledged.push(a) : undefined)));
  // Killed as soon as any upload of the second round is answered (or fails): the rest are cut wherever they are.
  await Promise.race(inFlight);
  await kill(first.proc, 'SIGKILL');
  await Promise.all(inFlight);
  stalled.destroy();

  // What the crash left, before anything cleans it: the stalled upload's temp file at least.
  expect(fs.readdirSync(tempDir).length).toBeGreaterThan(0);
  db = createDb(dbSource, { poolSize: 1 });
  const rows = async <T>(query: RawBuilder<T>): Promise<T[]> => (await query.execute(db!)).rows;
  // PostgreSQL outlives its killed client: it ends the dead process's sessions and rolls back any transaction they had
  // open, so nothing half-written is committed and nothing stays locked before the next start.
  if (testEngine() === 'postgres') {
    await waitFor('the killed server’s sessions to end', async () => {
      const [others] = await rows(sql<{ n: number }>`select count(*) as n from pg_stat_activity
        where datname = current_database() and backend_type = 'client backend' and pid <> pg_backend_pid()`);
      return others!.n === 0 ? true : undefined;
    });
  }
  // A log whose check was cut off, certain whatever the kill hit: an acknowledged log of the first round set back as it
  // was while its check ran.
  const cutOff = acknowledged.find((a) => a.table === 'datalogs')!;
  await sql`update datalogs set status = 'processing', error = null, report = null where id = ${cutOff.id}`.execute(db);
  const [unfinished] = await rows(sql<{ n: number }>`select count(*) as n from datalogs where status = 'processing'`);
  // A file stored just before its row would have been written, long enough ago to count as an orphan.
  const orphan = new DiskBlobStore(dataDir).pathOf('0'.repeat(64));
  fs.mkdirSync(path.dirname(orphan), { recursive: true });
  fs.writeFileSync(orphan, 'orphan');
  const twoHoursAgo = new Date(Date.now() - 2 * 3_600_000);
  fs.utimesSync(orphan, twoHoursAgo, twoHoursAgo);

  const second = await startServer(port);
  const recovery = await waitFor('the recovery log line', () => {
    const line = second.lines.find((l) => l.includes('"start-up recovery"'));
    return line ? (JSON.parse(line) as Record<string, number>) : undefined;
  });
  expect(recovery.tempFiles).toBeGreaterThan(0);
  // Every log left processing is checked again (its uploader, the owner, is still a member).
  expect([recovery.datalogsRequeued, recovery.datalogsFailed]).toEqual([unfinished!.n, 0]);
  expect(recovery.orphanBlobs).toBe(1);
  expect(fs.existsSync(orphan)).toBe(false);
  expect(fs.readdirSync(tempDir)).toEqual([]);

  try {
    // SQLite's own check of the file after the kill (on PostgreSQL, see the sessions check above).
    if (testEngine() === 'sqlite') expect(await rows(sql<{ integrity_check: string }>`pragma integrity_check`)).toEqual([{ integrity_check: 'ok' }]);
    for (const a of acknowledged) {
      const found = await rows(sql<{ sha256: string }>`select sha256 from ${sql.table(a.table)} where id = ${a.id}`);
      expect(found, `${a.table} ${a.id} answered 2xx`).toEqual([{ sha256: a.sha256 }]);
      expect(fs.existsSync(new DiskBlobStore(dataDir).pathOf(a.sha256))).toBe(true);
    }
    const referenced = await rows(sql<{ sha256: string }>`select sha256 from calibration_files union select sha256 from datalogs`);
    expect(referenced.filter((r) => !fs.existsSync(new DiskBlobStore(dataDir).pathOf(r.sha256)))).toEqual([]);

    // Nobody opens a log: the list of the job's logs (which starts nothing) is polled until every one has ended.
    const ownerCookie = await signInCookie(second.base, ownerEmail);
    await waitFor(
      'every log to end ready or failed',
      async () => {
        const statuses = await Promise.all(
          jobIds.map(async (id) => {
            const res = await fetch(`${second.base}/api/jobs/${id}/datalogs`, { headers: { cookie: ownerCookie } });
            return ((await res.json()) as { data: { status: string }[] }).data.map((d) => d.status);
          }),
        );
        return statuses.flat().every((s) => s === 'ready' || s === 'failed') ? true : undefined;
      },
      90_000,
    );
    expect(await rows(sql<{ n: number }>`select count(*) as n from datalogs where status = 'processing'`)).toEqual([{ n: 0 }]);
    // The log whose check was cut off was checked again to the end.
    expect(await rows(sql<{ status: string }>`select status from datalogs where id = ${cutOff.id}`)).toEqual([{ status: 'ready' }]);
  } finally {
    await kill(second.proc, 'SIGTERM');
  }
});
