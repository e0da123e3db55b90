// Scale benchmark: the board list and the job page on PostgreSQL beside SQLite (same 10,000-job shop), then the board
// list through a small round-robin reverse proxy with one server instance against two on the same PostgreSQL database.
// Run: npx tsx scripts/bench/scale.ts [jobs] (or BENCH_ONLY=scale npm run bench). Needs PostgreSQL's programs
// (initdb, pg_ctl) installed; the cluster is a throwaway one in a temp folder, removed afterwards.
// Every measurement runs BENCH_REPEAT times (default 3), the compared ones taking turns round by round (SQLite, then
// PostgreSQL; one instance, then two), so a change in the machine's load falls on both sides; it prints each run, then
// the median and the spread (min–max) of req/s, p99 and server CPU per request.
import type { ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import http from 'node:http';
import os from 'node:os';
import path from 'node:path';
import autocannon from 'autocannon';
import pg from 'pg';
import { createDb } from '@revloop/db';
import { APP_ROLE, startCluster, type Cluster } from '../../tests/with-postgres';
import { BOARD_QUERY, CONNECTIONS, DURATION_S, JOB_PAGE_PATHS, TARGET_P99_MS, TARGET_RPS, buildShop, cpuMsOf, jobPageRequests, signInOwner, startServer, type Figure } from './board';
import { freePort } from '../../apps/api/src/testing/free-port';

const DATABASE = 'revloop_bench';

/** How many times each measurement runs (BENCH_REPEAT, default 3). */
function repeatCount(): number {
  const raw = process.env.BENCH_REPEAT ?? '3';
  const n = Number(raw);
  if (!Number.isInteger(n) || n < 1) throw new Error(`BENCH_REPEAT must be a whole number of runs, at least 1 (got "${raw}").`);
  return n;
}

const loadAverage = () => `${os.loadavg().map((l) => l.toFixed(1)).join(', ')} (1, 5, 15 min) on ${os.availableParallelism()} cores`;

function median(values: number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const mid = Math.floor(sorted.length / 2);
  return sorted.length % 2 ? sorted[mid]! : (sorted[mid - 1]! + sorted[mid]!) / 2;
}

/** The runs of one measurement: its figures per run, printed as they come and summed up by `summary`. */
class Repeated {
  readonly rps: number[] = [];
  readonly p99: number[] = [];
  readonly cpuPerRequest: number[] = [];
  failed = 0;

  constructor(
    readonly label: string,
    private readonly targets: { rps?: number; p99: number },
    private readonly runs: number,
  ) {}

  add(result: autocannon.Result & { cpuMs: number }): void {
    const failed = result.non2xx + result.errors + result.timeouts;
    this.failed += failed;
    this.rps.push(result.requests.average);
    this.p99.push(result.latency.p99);
    this.cpuPerRequest.push(result.cpuMs / Math.max(1, result.requests.total));
    console.log(
      `  run ${this.rps.length}/${this.runs} ${this.label}: ${Math.round(result.requests.average)} req/s, p99 ${result.latency.p99} ms, ` +
        `${result.requests.total} requests, ${failed} failed; server CPU ${this.cpuPerRequest.at(-1)!.toFixed(2)} ms per request`,
    );
  }

  /** The medians against the targets; any failed request in any run fails the figure. */
  summary(): Figure {
    const rps = median(this.rps);
    const p99 = median(this.p99);
    const ok = this.failed === 0 && (this.targets.rps === undefined || rps >= this.targets.rps) && p99 <= this.targets.p99;
    const target = `${this.targets.rps === undefined ? '' : `≥ ${this.targets.rps} req/s, `}p99 ≤ ${this.targets.p99} ms`;
    const spread = (xs: number[], digits = 0) => `${Math.min(...xs).toFixed(digits)}–${Math.max(...xs).toFixed(digits)}`;
    const label =
      `${this.label}: median of ${this.rps.length} runs ${Math.round(rps)} req/s (${spread(this.rps)}), p99 ${p99} ms (${spread(this.p99)}), ` +
      `server CPU ${median(this.cpuPerRequest).toFixed(2)} ms/request (${spread(this.cpuPerRequest, 2)})`;
    return { label, rps, p99, ok, target: this.failed ? `${target}; ${this.failed} requests failed or timed out` : target };
  }
}

/** Runs autocannon and adds the CPU time the given server processes used meanwhile. */
async function measure(pids: Array<number | undefined>, options: autocannon.Options): Promise<autocannon.Result & { cpuMs: number }> {
  const cpu = () => pids.reduce<number>((sum, pid) => sum + cpuMsOf(pid), 0);
  const before = cpu();
  const result = await autocannon({ duration: DURATION_S, connections: CONNECTIONS, ...options });
  return { ...result, cpuMs: cpu() - before };
}

async function stop(server: ChildProcess | undefined): Promise<void> {
  if (server && server.exitCode === null) await new Promise((resolve) => server.once('exit', resolve).kill('SIGTERM'));
}

/** One server of an engine, signed in and warmed up, with the two measurements the engines are compared on. */
async function engineUnderTest(engine: string, server: ChildProcess, base: string, jobIds: string[], runs: number) {
  const headers = { cookie: await signInOwner(base) };
  const pids = [server.pid];
  await measure(pids, { url: base + BOARD_QUERY, headers, duration: 3 }); // warm-up: JIT and caches
  const board = new Repeated(`${engine.padEnd(10)} board list GET ${BOARD_QUERY}`, { rps: TARGET_RPS, p99: TARGET_P99_MS }, runs);
  const page = new Repeated(`${engine.padEnd(10)} job page   ${JOB_PAGE_PATHS.length} requests per page view`, { rps: TARGET_RPS, p99: TARGET_P99_MS }, runs);
  return {
    board,
    page,
    /** One run of each. */
    round: async () => {
      board.add(await measure(pids, { url: base + BOARD_QUERY, headers }));
      page.add(await measure(pids, { url: base, headers, requests: jobPageRequests(jobIds) }));
    },
  };
}

/** A reverse proxy (node:http, keep-alive, round-robin over the targets' ports); returns its port and a close. */
async function startProxy(ports: number[]): Promise<{ port: number; setTargets: (n: number) => void; close: () => Promise<void> }> {
  const agent = new http.Agent({ keepAlive: true, maxSockets: 64 });
  let count = ports.length;
  let next = 0;
  const proxy = http.createServer((req, res) => {
    const target = ports[next++ % count]!;
    const upstream = http.request({ host: '127.0.0.1', port: target, method: req.method, path: req.url, headers: req.headers, agent }, (up) => {
      res.writeHead(up.statusCode ?? 502, up.headers);
      up.pipe(res);
    });
    upstream.on('error', () => {
      if (!res.headersSent) res.writeHead(502);
      res.end();
    });
    req.pipe(upstream);
  });
  const port = await freePort();
  await new Promise<void>((resolve) => proxy.listen(port, '127.0.0.1', resolve));
  return {
    port,
    setTargets: (n) => {
      count = n;
    },
    close: async () => {
      agent.destroy();
      await new Promise((resolve) => proxy.close(resolve));
    },
  };
}

async function main(): Promise<void> {
  const jobCount = Number(process.argv[2] ?? 10_000);
  const runs = repeatCount();
  const loadAtStart = loadAverage();
  console.log(`load average at the start: ${loadAtStart}; each measurement runs ${runs} times (BENCH_REPEAT)`);
  const dataDir = fs.mkdtempSync(path.join(os.tmpdir(), 'scale-bench-'));
  const servers: ChildProcess[] = [];
  let cluster: Cluster | undefined;
  try {
    // SQLite: the same shop as scripts/bench/board.ts, in a file.
    const sqliteDir = path.join(dataDir, 'sqlite');
    fs.mkdirSync(sqliteDir);
    const sqliteDb = createDb(path.join(sqliteDir, 'revloop.db'));
    const sqliteJobs = await buildShop(sqliteDb, sqliteDir, jobCount);
    await sqliteDb.destroy();

    // PostgreSQL: a throwaway cluster, the app's role (no superuser, so row-level security applies), the same shop.
    cluster = startCluster();
    const admin = new pg.Client({ connectionString: cluster.adminUrl });
    await admin.connect();
    try {
      await admin.query(`create role ${APP_ROLE} login nosuperuser nobypassrls`);
      await admin.query(`create database ${DATABASE} owner ${APP_ROLE}`);
    } finally {
      await admin.end();
    }
    const databaseUrl = cluster.appUrl(DATABASE);
    const pgDir = path.join(dataDir, 'postgres');
    fs.mkdirSync(pgDir);
    const pgDb = createDb(databaseUrl);
    const pgJobs = await buildShop(pgDb, pgDir, jobCount);
    await pgDb.destroy();

    const loadBeforeMeasuring = loadAverage();
    console.log(`load average before measuring: ${loadBeforeMeasuring}`);
    const figures: Figure[] = [];

    // Part 1: one server per engine, both started, measured in turn (never both at once), round by round.
    const sqlitePort = await freePort();
    const sqliteServer = await startServer(sqliteDir, sqlitePort);
    servers.push(sqliteServer);
    const ports = [await freePort(), await freePort()];
    const first = await startServer(pgDir, ports[0]!, { DATABASE_URL: databaseUrl });
    servers.push(first);
    const engines = [
      await engineUnderTest('SQLite', sqliteServer, `http://127.0.0.1:${sqlitePort}`, sqliteJobs.map((j) => j.id), runs),
      await engineUnderTest('PostgreSQL', first, `http://127.0.0.1:${ports[0]}`, pgJobs.map((j) => j.id), runs),
    ];
    for (let r = 0; r < runs; r++) for (const e of engines) await e.round();
    for (const e of engines) figures.push(e.board.summary(), e.page.summary());
    await stop(sqliteServer);

    // Part 2: the board list through the proxy, one instance then two, on the same PostgreSQL database.
    const second = await startServer(pgDir, ports[1]!, { DATABASE_URL: databaseUrl });
    servers.push(second);
    const proxy = await startProxy(ports);
    try {
      const base = `http://127.0.0.1:${proxy.port}`;
      // Signed in at the first instance (its origin); sessions are rows in the database, so both accept the cookie.
      const headers = { cookie: await signInOwner(`http://127.0.0.1:${ports[0]}`) };
      const pids = [first.pid, second.pid];
      await measure(pids, { url: base + BOARD_QUERY, headers, duration: 3 }); // warm-up of both instances
      const one = new Repeated('proxy, 1 instance  board list', { p99: TARGET_P99_MS * 4 }, runs);
      const two = new Repeated('proxy, 2 instances board list', { p99: TARGET_P99_MS * 4 }, runs);
      for (let r = 0; r < runs; r++) {
        proxy.setTargets(1);
        one.add(await measure(pids, { url: base + BOARD_QUERY, headers }));
        proxy.setTargets(2);
        two.add(await measure(pids, { url: base + BOARD_QUERY, headers }));
      }
      figures.push(one.summary(), two.summary());
      // Per round (one and two measured back to back), so each ratio sees about the same load.
      const ratios = two.rps.map((rps, r) => rps / Math.max(1, one.rps[r]!));
      console.log(
        `  two instances against one: ${(median(two.rps) / Math.max(1, median(one.rps))).toFixed(2)}× the board list's median throughput through the proxy ` +
          `(per round ${ratios.map((x) => x.toFixed(2)).join(', ')})`,
      );
    } finally {
      await proxy.close();
    }

    console.log(`load average at the start ${loadAtStart}; before measuring ${loadBeforeMeasuring}; at the end ${loadAverage()}`);
    for (const f of figures) console.log(`${f.ok ? 'PASS' : 'FAIL'}  ${f.label} (target ${f.target})`);
    console.log(
      [
        `What this means on this machine (${os.availableParallelism()} cores): the load generator (autocannon), the proxy, PostgreSQL and the`,
        'servers share the same cores, so a second instance cannot double throughput here; a ratio near or below 1 says the',
        'cores are full, not that instances do not scale. The figure that carries over to bigger machines is server CPU per',
        'request: with the load generator and the database on other cores, throughput grows with instances until the database',
        'is the limit. PostgreSQL runs here with fsync off in a throwaway cluster; only reads are measured.',
      ].join('\n'),
    );
    process.exitCode = figures.every((f) => f.ok) ? 0 : 1;
  } finally {
    for (const s of servers) await stop(s);
    cluster?.stop();
    fs.rmSync(dataDir, { recursive: true, force: true });
  }
}

await main();
