// Reports benchmark: the owner's six report endpoints on a shop with 10,000 jobs (the board bench's history, plus
// jobs dialed in, customer payments and two analysed logs per finished job), one year at a time, on the real server
// in a child process, loaded with autocannon, and the Customers list sorted by money paid on the same data.
// Run: npx tsx scripts/bench/reports.ts [jobs], or BENCH_ONLY=reports npm run bench
import type { ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import autocannon from 'autocannon';
import { backfillJobStints, createDb, migrateToLatest, newId, refreshCustomerSummaries, type Db } from '@revloop/db';
import { seedDemo, type SeededShop } from '../../seeds/demo/seed-demo';
import { DEMO_PASSWORD } from '../../seeds/demo/people';
import { DiskBlobStore } from '../../apps/api/src/storage/blob-store';
import { freePort } from '../../apps/api/src/testing/free-port';
import { addHistory, cpuMsOf, report, startServer, type Figure } from './board';

const DURATION_S = 5;
const CONNECTIONS = 2;
/** An owner opening the reports page waits for six requests at once: each should answer well inside a page load. */
const TARGET_P99_MS = 200;
const CHECKS = ['required_channels', 'engine_warm', 'full_throttle', 'wot_gears', 'sensor_sanity'];

function chunks<T>(items: T[], size: number): T[][] {
  return Array.from({ length: Math.ceil(items.length / size) }, (_, i) => items.slice(i * size, (i + 1) * size));
}

/** What the reports read besides the moves: a dialed-in move per finished job, its payment, and two analysed logs. */
export async function addReportHistory(db: Db, shop: SeededShop): Promise<{ payments: number; logs: number }> {
  let payments = 0;
  let logs = 0;
  await db.transaction().execute(async (trx) => {
    const jobs = await trx
      .selectFrom('jobs')
      .innerJoin('packages', 'packages.id', 'jobs.package_id')
      .select(['jobs.id', 'jobs.state', 'jobs.created_at', 'jobs.state_changed_at', 'jobs.customer_user_id', 'jobs.assigned_tuner_id', 'packages.retail_price_minor'])
      .where('jobs.shop_id', '=', shop.shopId)
      .where('jobs.dealer_id', 'is', null)
      .execute();
    const done = jobs.filter((j) => j.state === 'dialed_in');
    for (const chunk of chunks(done, 500)) {
      await trx
        .insertInto('audit_events')
        .values(chunk.map((j) => ({ id: newId(), shop_id: shop.shopId, actor_user_id: j.assigned_tuner_id, action: 'job.moved', subject_type: 'Job', subject_id: j.id, details: JSON.stringify({ from: 'log_review', to: 'dialed_in', round: 2 }), created_at: j.state_changed_at })))
        .execute();
      await trx
        .insertInto('payments')
        .values(
          chunk.map((j) => ({
            id: newId(),
            shop_id: shop.shopId,
            purpose: 'job' as const,
            job_id: j.id,
            dealer_id: null,
            payer_user_id: j.customer_user_id,
            amount_minor: j.retail_price_minor,
            currency: 'usd',
            status: 'paid' as const,
            stripe_checkout_session_id: `cs_bench_${j.id}`,
            created_at: j.created_at,
            paid_at: j.created_at,
          })),
        )
        .execute();
      payments += chunk.length;
      // The datalog_checks trigger fills one row per check from each report, as it does for a real upload.
      const rows = chunk.flatMap((j, k) =>
        [1, 2].map((round) => ({
          id: newId(),
          shop_id: shop.shopId,
          job_id: j.id,
          round,
          original_name: `rev${round}.csv`,
          sha256: '0'.repeat(64),
          size_bytes: 1_000_000,
          header_signature: 'bench',
          mapping: '{}',
          fuel: '{}',
          status: 'ready' as const,
          error: null,
          report: JSON.stringify({ rows: 6000, checks: CHECKS.map((id, c) => ({ id, status: (k + c + round) % 7 === 0 ? 'fail' : (k + c) % 5 === 0 ? 'warn' : 'pass', message: '' })) }),
          uploaded_by: j.customer_user_id,
          created_at: j.created_at,
        })),
      );
      await trx.insertInto('datalogs').values(rows).execute();
      logs += rows.length;
    }
  });
  return { payments, logs };
}

async function main(): Promise<void> {
  const jobCount = Number(process.argv[2] ?? 10_000);
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'reports-bench-'));
  let server: ChildProcess | undefined;
  try {
    const built = performance.now();
    const db = createDb(path.join(dataDir, 'revloop.db'));
    await migrateToLatest(db);
    const now = new Date();
    const ids = await seedDemo(db, now, { blobs: new DiskBlobStore(dataDir) });
    const { events } = await addHistory(db, ids.kestrel, jobCount, now);
    const { payments, logs } = await addReportHistory(db, ids.kestrel);
    // The history above is written in bulk, past the app's writers: derive what they would have kept, as migration 015 does.
    await backfillJobStints(db);
    await refreshCustomerSummaries(db, ids.kestrel.shopId, now.toISOString());
    await db.destroy();
    console.log(`data: ${jobCount.toLocaleString('en')} jobs, ${events.toLocaleString('en')}+ audit events, ${payments.toLocaleString('en')} payments, ${logs.toLocaleString('en')} analysed logs in one shop, built in ${((performance.now() - built) / 1000).toFixed(1)} s`);

    const port = await freePort();
    server = await startServer(dataDir, port);
    const base = `http://127.0.0.1:${port}`;
    const signIn = await fetch(`${base}/api/auth/sign-in`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', origin: base },
      body: JSON.stringify({ email: 'owner@kestrel.test', password: DEMO_PASSWORD }),
    });
    if (signIn.status !== 200) throw new Error(`sign-in answered ${signIn.status}`);
    const headers = { cookie: signIn.headers.getSetCookie().find((c) => c.startsWith('revloop_session='))!.split(';')[0]! };

    // The reports page's default is four months; a whole year is the heavier case an owner asks for at year end.
    const day = (d: Date) => d.toISOString().slice(0, 10);
    const range = `from=${day(new Date(now.getTime() - 365 * 86_400_000))}&to=${day(now)}`;
    const paths = ['turnaround', 'rounds', 'weekly-jobs', 'tuner-load', 'revenue?by=month', 'revenue?by=package', 'revenue?by=dealer', 'log-quality'].map(
      (p) => `/api/reports/${p}${p.includes('?') ? '&' : '?'}${range}`,
    );
    // The Customers list sorted by money paid reads the same payments and refunds.
    const customersByPaid = '/api/customers?sort=paid&dir=desc&pageSize=25';
    await autocannon({ url: base + paths[0], headers, duration: 2, connections: 1 });
    console.log(`load average before measuring: ${os.loadavg().map((l) => l.toFixed(1)).join(', ')} on ${os.availableParallelism()} cores`);

    const figures: Figure[] = [];
    for (const p of [...paths, `${paths[0]}&format=csv`, customersByPaid]) {
      const before = cpuMsOf(server.pid);
      const result = await autocannon({ url: base + p, headers, duration: DURATION_S, connections: CONNECTIONS });
      figures.push(report(`GET ${p.replace(range, 'one year')}`, { ...result, cpuMs: cpuMsOf(server.pid) - before }, { p99: TARGET_P99_MS }));
    }
    for (const f of figures) console.log(`${f.ok ? 'PASS' : 'FAIL'}  ${f.label}: ${Math.round(f.rps)} req/s, p99 ${f.p99} ms (target ${f.target})`);
    process.exitCode = figures.every((f) => f.ok) ? 0 : 1;
  } finally {
    if (server && server.exitCode === null) await new Promise((resolve) => server!.once('exit', resolve).kill('SIGTERM'));
    fs.rmSync(dataDir, { recursive: true, force: true });
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) await main();
