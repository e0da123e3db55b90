// Datalog benchmark, paired against pandas: generated 1,000,000-row and 20,000-row 17-channel logs are read and
// gridded by the CLI as a user runs it (`npm run -s analyze -- FILE.csv`) and by scripts/bench/datalog_pandas.py
// (the same read, closed-loop warm filter and rpm × MAP grid of mean trims), runs interleaved, medians compared.
// Wall time, CPU time (user + sys of the whole tree) and peak RSS come from a small Python wrapper (getrusage of its
// children; the peak is the largest process of the tree). CPU time is printed beside wall time because on a busy
// machine wall time mostly measures the wait for a core. The floor of `npm run -s` (npm starting a script that does
// nothing) is printed too: no CLI can be faster than that through npm.
// Then the product path: a 20,000-row log uploaded through the API, timed from the upload's answer to the report
// being on screen, with the web client's own polling schedule.
// Run: npm run bench (or npx tsx scripts/bench/datalog.ts). Exits 1 when a target fails.
import { execFileSync, spawnSync } from 'node:child_process';
import { closeSync, existsSync, mkdtempSync, openSync, readFileSync, rmSync, statSync, writeSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join, resolve } from 'node:path';
import type { DatalogReport } from '@revloop/domain/datalog';
import { generateLogChunks } from '@revloop/domain/datalog/testing';
import { createJob, createShop } from '../../apps/api/src/testing/factories';
import { createTestApp, signIn } from '../../apps/api/src/testing/test-app';
import { warmAnalysisWorker } from '../../apps/api/src/workers/datalog/analyze-file';
import type { Datalog } from '@revloop/contract';
import { processingPollMs } from '../../apps/web/src/features/datalogs/api/get-datalog';

const ROOT = resolve(import.meta.dirname, '../..');
const PANDAS_SCRIPT = join(ROOT, 'scripts/bench/datalog_pandas.py');
/** Debian's interpreter: python3-pandas installs for it, whatever python3 comes first on PATH. */
const PYTHON = existsSync('/usr/bin/python3') ? '/usr/bin/python3' : 'python3';
const TARGETS = { wallLarge: 0.5, rssLarge: 0.3, wallSmall: 0.5, uploadToScreenMs: 300 };
const RUNS = { large: 3, small: 7, uploads: 7 };

// Runs a command once and reports its wall time and the peak RSS of its largest process.
const MEASURE = `
import json, resource, subprocess, sys, time
start = time.perf_counter()
done = subprocess.run(sys.argv[1:], stdout=subprocess.PIPE, stderr=subprocess.PIPE)
wall = time.perf_counter() - start
peak = resource.getrusage(resource.RUSAGE_CHILDREN).ru_maxrss / 1024
usage = resource.getrusage(resource.RUSAGE_CHILDREN)
print(json.dumps({"code": done.returncode, "wallS": wall, "cpuS": usage.ru_utime + usage.ru_stime, "peakMb": peak, "stdout": done.stdout.decode(), "stderr": done.stderr.decode()[-2000:]}))
`;

interface Run {
  wallS: number;
  cpuS: number;
  peakMb: number;
  stdout: string;
}

function measure(command: string[]): Run {
  const out = execFileSync(PYTHON, ['-c', MEASURE, ...command], { encoding: 'utf8', maxBuffer: 1 << 28 });
  const run = JSON.parse(out) as Run & { code: number; stderr: string };
  if (run.code !== 0) throw new Error(`${command.join(' ')} failed: ${run.stderr}`);
  return run;
}

const median = (values: number[]) => {
  const sorted = [...values].sort((a, b) => a - b);
  return sorted[Math.floor(sorted.length / 2)] as number;
};

function generate(path: string, rows: number): void {
  const fd = openSync(path, 'w');
  const chunks = generateLogChunks({
    rows,
    twoBanks: true,
    pulls: [{ gears: [2, 3] }, { gears: [3] }],
    knock: [{ pull: 0, atFraction: 0.5, peakDeg: 3 }],
    trimErrors: [{ rpm: [2000, 2500], map: [40, 50], trimPct: 8 }],
  });
  for (let next = chunks.next(); !next.done; next = chunks.next()) writeSync(fd, next.value);
  closeSync(fd);
}

/** pandas from Debian (python3-pandas); installed here only when running as root, as the test script does. */
function pandasReady(): boolean {
  const has = () => spawnSync(PYTHON, ['-c', 'import pandas'], { stdio: 'ignore' }).status === 0;
  if (has()) return true;
  if (process.getuid?.() === 0 && spawnSync('which', ['apt-get'], { stdio: 'ignore' }).status === 0) {
    console.log('Installing python3-pandas (apt-get) for the paired comparison…');
    spawnSync('apt-get', ['update', '-qq'], { stdio: 'inherit' });
    spawnSync('apt-get', ['install', '-y', '-qq', 'python3-pandas'], {
      stdio: 'inherit',
      env: { ...process.env, DEBIAN_FRONTEND: 'noninteractive' },
    });
    if (has()) return true;
  }
  return false;
}

const verdict = (ok: boolean) => (ok ? 'PASS' : 'FAIL');

/** CLI and pandas on one file, runs interleaved so both see the same machine load. */
function compare(path: string, runs: number, pandas: boolean, floor: boolean) {
  const cli: Run[] = [];
  const direct: Run[] = [];
  const npmFloor: Run[] = [];
  const py: Run[] = [];
  for (let i = 0; i < runs; i++) {
    cli.push(measure(['npm', 'run', '-s', 'analyze', '--', path]));
    // The same compiled CLI without npm's launcher, to show how much of the time is npm's own start-up.
    direct.push(measure([process.execPath, join(ROOT, 'apps/api/dist/node/analyze.mjs'), path]));
    // npm's built-in `env` script: npm, its shell and a program that does next to nothing.
    if (floor) npmFloor.push(measure(['npm', 'run', '-s', 'env']));
    if (pandas) py.push(measure([PYTHON, PANDAS_SCRIPT, path]));
  }
  const report = JSON.parse((cli[0] as Run).stdout) as DatalogReport;
  const cells = pandas ? (JSON.parse((py[0] as Run).stdout) as { cells: number }).cells : null;
  return {
    rows: report.rows,
    cliCells: report.fuelTrim.cells.length,
    pandasCells: cells,
    cliWall: median(cli.map((r) => r.wallS)),
    cliCpu: median(cli.map((r) => r.cpuS)),
    directWall: median(direct.map((r) => r.wallS)),
    directCpu: median(direct.map((r) => r.cpuS)),
    floorWall: floor ? median(npmFloor.map((r) => r.wallS)) : null,
    floorCpu: floor ? median(npmFloor.map((r) => r.cpuS)) : null,
    cliPeak: median(cli.map((r) => r.peakMb)),
    pandasWall: pandas ? median(py.map((r) => r.wallS)) : null,
    pandasCpu: pandas ? median(py.map((r) => r.cpuS)) : null,
    pandasPeak: pandas ? median(py.map((r) => r.peakMb)) : null,
  };
}

function printComparison(
  label: string,
  c: ReturnType<typeof compare>,
  targets: { wall: number; rss?: number },
): boolean {
  const times = (wall: number, cpu: number) => `${wall.toFixed(2)} s (CPU ${cpu.toFixed(2)} s)`;
  console.log(
    `${label}: CLI ${times(c.cliWall, c.cliCpu)}, peak ${c.cliPeak.toFixed(0)} MB (${c.rows} rows, ${c.cliCells} trim cells)` +
      (c.pandasWall === null
        ? ''
        : `; pandas ${times(c.pandasWall, c.pandasCpu as number)}, peak ${(c.pandasPeak as number).toFixed(0)} MB (${c.pandasCells} cells)`),
  );
  if (c.pandasWall === null || c.pandasPeak === null || c.pandasCpu === null) {
    console.log(`  SKIPPED: wall time ≤ ${targets.wall}× pandas (pandas is not installed)`);
    if (targets.rss !== undefined) console.log(`  SKIPPED: peak memory ≤ ${targets.rss}× pandas (pandas is not installed)`);
    return true;
  }
  let ok = true;
  const wall = c.cliWall / c.pandasWall;
  const ofPandas = (wallS: number, cpuS: number) =>
    `${(wallS / (c.pandasWall as number)).toFixed(2)}× pandas (CPU ${(cpuS / (c.pandasCpu as number)).toFixed(2)}×)`;
  console.log(
    `  ${verdict(wall <= targets.wall)}: wall time ${wall.toFixed(2)}× pandas (target ≤ ${targets.wall}×; CPU time ${(c.cliCpu / c.pandasCpu).toFixed(2)}×)`,
  );
  console.log(
    `  info: without npm's launcher (node apps/api/dist/node/analyze.mjs) ${times(c.directWall, c.directCpu)} = ${ofPandas(c.directWall, c.directCpu)}`,
  );
  if (c.floorWall !== null && c.floorCpu !== null)
    console.log(
      `  info: npm's floor (\`npm run -s env\`, a script that does next to nothing) ${times(c.floorWall, c.floorCpu)} = ${ofPandas(c.floorWall, c.floorCpu)}`,
    );
  ok &&= wall <= targets.wall;
  if (targets.rss !== undefined) {
    const rss = c.cliPeak / c.pandasPeak;
    console.log(`  ${verdict(rss <= targets.rss)}: peak memory ${rss.toFixed(2)}× pandas (target ≤ ${targets.rss}×)`);
    ok &&= rss <= targets.rss;
  }
  return ok;
}

/** Upload → report on screen through the API, polling as the web client does (processingPollMs). */
async function uploadToScreen(path: string): Promise<boolean> {
  const t = await createTestApp();
  try {
    warmAnalysisWorker();
    await new Promise((r) => setTimeout(r, 500));
    const job = await createJob(t, await createShop(t), { state: 'with_customer' });
    const agent = await signIn(t.app, job.customer.email);
    const bytes = readFileSync(path);
    const ready: number[] = [];
    const onScreen: number[] = [];
    for (let i = 0; i < RUNS.uploads; i++) {
      const res = await agent.post(`/api/jobs/${job.id}/datalogs`).attach('file', bytes, 'drive.csv');
      if (res.status !== 202) throw new Error(`upload answered ${res.status}: ${JSON.stringify(res.body)}`);
      const uploaded = performance.now();
      const { id, createdAt } = res.body.data as { id: string; createdAt: string };
      // The web client refetches as soon as the upload answers, then waits processingPollMs between polls.
      for (;;) {
        const log = await agent.get(`/api/datalogs/${id}`);
        const data = log.body.data as Datalog;
        if (data.status !== 'processing') break;
        const elapsed = performance.now() - uploaded;
        const wait = processingPollMs([data], Date.parse(createdAt) + elapsed) || 0;
        await new Promise((r) => setTimeout(r, wait));
      }
      onScreen.push(performance.now() - uploaded);
      // Server side alone: a second upload polled every 5 ms.
      const again = await agent.post(`/api/jobs/${job.id}/datalogs`).attach('file', bytes, 'drive.csv');
      const start = performance.now();
      const againId = (again.body.data as { id: string }).id;
      while (((await agent.get(`/api/datalogs/${againId}`)).body.data as { status: string }).status === 'processing')
        await new Promise((r) => setTimeout(r, 5));
      ready.push(performance.now() - start);
    }
    const screen = median(onScreen);
    console.log(
      `API, 20,000-row log: report ready ${median(ready).toFixed(0)} ms after the upload answered (server, median of ${RUNS.uploads});` +
        ` on screen with the web client's polling ${screen.toFixed(0)} ms (median; worst ${Math.max(...onScreen).toFixed(0)} ms)`,
    );
    const ok = screen <= TARGETS.uploadToScreenMs;
    console.log(`  ${verdict(ok)}: upload finished → report on screen ≤ ${TARGETS.uploadToScreenMs} ms`);
    return ok;
  } finally {
    await t.close();
  }
}

async function main(): Promise<void> {
  const dir = mkdtempSync(join(tmpdir(), 'datalog-bench-'));
  try {
    const large = join(dir, 'large.csv');
    const small = join(dir, 'small.csv');
    generate(large, 1_000_000);
    generate(small, 20_000);
    const header = readFileSync(small, 'utf8').split('\n', 1)[0] ?? '';
    console.log(
      `logs: 1,000,000 rows × ${header.split(',').length} channels (${(statSync(large).size / 1e6).toFixed(1)} MB), 20,000 rows (${(statSync(small).size / 1e6).toFixed(1)} MB)`,
    );
    // Built once up front, so no run pays for a build.
    execFileSync(process.execPath, [join(ROOT, 'apps/api/scripts/build-node.mjs')], { stdio: 'inherit', cwd: ROOT });

    const pandas = pandasReady();
    if (!pandas)
      console.log(
        'pandas is not installed (Debian package python3-pandas; install it as root to compare): the comparison with pandas is SKIPPED, only the CLI is timed.',
      );
    let ok = printComparison('1,000,000 rows', compare(large, RUNS.large, pandas, false), {
      wall: TARGETS.wallLarge,
      rss: TARGETS.rssLarge,
    });
    ok = printComparison('20,000 rows', compare(small, RUNS.small, pandas, true), { wall: TARGETS.wallSmall }) && ok;
    ok = (await uploadToScreen(small)) && ok;
    process.exitCode = ok ? 0 : 1;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

await main();
