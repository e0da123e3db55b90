// Datalog benchmark: a 1,000,000-row, 17-channel generated log, read from disk and analysed as the product does
// (file → bytes → report) in a fresh child process, so peak RSS belongs to the analysis alone.
// Run: npx tsx scripts/bench/datalog.ts [rows]
import { execFileSync } from 'node:child_process';
import {
  closeSync,
  mkdtempSync,
  openSync,
  readFileSync,
  rmSync,
  statSync,
  writeSync,
} from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { analyzeDatalog } from '@revloop/domain/datalog';
import { DEMO_VEHICLE, generateLogChunks } from '@revloop/domain/datalog/testing';

const TARGET_SECONDS = 3;
const TARGET_RSS_MB = 400;

interface Measurement {
  rows: number;
  elapsedMs: number;
  maxRssMb: number;
  pulls: number;
  knockEvents: number;
}

function measure(path: string): void {
  const start = performance.now();
  const bytes = readFileSync(path);
  const report = analyzeDatalog(new Uint8Array(bytes.buffer, bytes.byteOffset, bytes.byteLength), {
    vehicle: DEMO_VEHICLE,
  });
  const elapsedMs = performance.now() - start;
  const result: Measurement = {
    rows: report.rows,
    elapsedMs,
    // resourceUsage().maxRSS is in kilobytes.
    maxRssMb: process.resourceUsage().maxRSS / 1024,
    pulls: report.wot.pulls.length,
    knockEvents: report.knock.events.length,
  };
  process.stdout.write(JSON.stringify(result));
}

function main(): void {
  const rows = Number(process.argv[2] ?? 1_000_000);
  const dir = mkdtempSync(join(tmpdir(), 'datalog-bench-'));
  const path = join(dir, 'bench.csv');
  try {
    const generateStart = performance.now();
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
    const bytes = statSync(path).size;
    const header = readFileSync(path, 'utf8').slice(0, 2000).split('\n')[0] ?? '';
    console.log(
      `generated ${rows} rows × ${header.split(',').length} channels, ${(bytes / 1e6).toFixed(1)} MB in ${((performance.now() - generateStart) / 1000).toFixed(1)} s`,
    );

    const childStart = performance.now();
    const out = execFileSync(
      process.execPath,
      ['--import', 'tsx', fileURLToPath(import.meta.url), '--measure', path],
      { encoding: 'utf8' },
    );
    const childMs = performance.now() - childStart;
    const m = JSON.parse(out) as Measurement;
    const seconds = m.elapsedMs / 1000;
    console.log(
      `read + analyse: ${seconds.toFixed(2)} s (child process incl. tsx start ${(childMs / 1000).toFixed(2)} s)`,
    );
    console.log(
      `throughput: ${Math.round(m.rows / seconds).toLocaleString('en')} rows/s, ${(bytes / 1e6 / seconds).toFixed(1)} MB/s`,
    );
    console.log(
      `peak RSS: ${m.maxRssMb.toFixed(0)} MB; report: ${m.rows} rows, ${m.pulls} pulls, ${m.knockEvents} knock events`,
    );
    const ok = seconds <= TARGET_SECONDS && m.maxRssMb <= TARGET_RSS_MB;
    console.log(`${ok ? 'PASS' : 'MISS'}: target ≤ ${TARGET_SECONDS} s and ≤ ${TARGET_RSS_MB} MB`);
    process.exitCode = ok ? 0 : 1;
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

if (process.argv[2] === '--measure') measure(process.argv[3] ?? '');
else main();
