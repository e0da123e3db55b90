import { insertAuditEvent, insertDatalog, newId, type Db } from '@revloop/db';
import { analyzeDatalog, defaultLogRequest, detectCsvLayout, headerSignature, type DatalogReport } from '@revloop/domain/datalog';
import { generateLog, type GenerateLogOptions } from '@revloop/domain/datalog/testing';
import { vehicleFuelSpec } from '@revloop/domain/vehicles';
import type { BlobStore } from '../../apps/api/src/storage/blob-store';
import type { SeededJob } from './jobs-scenario';

// Short logs (about seven minutes at 10 Hz) keep the whole seed quick; every number here is invented demo data.
const BASE: GenerateLogOptions = { rateHz: 10, warmupS: 320, cruiseS: 60, gearChannel: true };

/** What went on in the drive: most logs are good, one has the pedal only half pressed, one knocks. */
function driveFor(kind: 'good' | 'lean' | 'half_pedal' | 'knock', round: number, twoBanks: boolean): GenerateLogOptions {
  const gears = round <= 1 ? [3] : [2, 3];
  const base = { ...BASE, twoBanks };
  switch (kind) {
    case 'half_pedal':
      return { ...base, pulls: [{ gears, pedalPct: 60 }] };
    case 'knock':
      return { ...base, pulls: [{ gears }], knock: [{ pull: 0, atFraction: 0.6, peakDeg: 4.5 }] };
    case 'lean':
      return {
        ...base,
        pulls: [{ gears }],
        leanWot: { aboveRpm: 4500, errorPct: 5 },
        trimErrors: [{ rpm: [2000, 2500], map: [40, 50], trimPct: 8 }],
      };
    case 'good':
      return { ...base, pulls: [{ gears }] };
  }
}

interface PlannedLog {
  job: SeededJob;
  round: number;
  kind: Parameters<typeof driveFor>[0];
  hoursAgo: number;
}

/** Logs for jobs in log review and dialed in (with the round before as history) and earlier rounds of jobs with the customer. */
function plan(jobs: SeededJob[]): PlannedLog[] {
  const logs: PlannedLog[] = [];
  let reviews = 0;
  for (const job of jobs) {
    if (job.state === 'log_review') {
      const kind = reviews === 0 ? 'half_pedal' : reviews === 1 ? 'knock' : 'lean';
      reviews++;
      if (job.round > 1) logs.push({ job, round: job.round - 1, kind: 'lean', hoursAgo: 72 });
      logs.push({ job, round: job.round, kind, hoursAgo: 2 + reviews });
    } else if (job.state === 'dialed_in') {
      logs.push({ job, round: job.round - 1, kind: 'lean', hoursAgo: 240 });
      logs.push({ job, round: job.round, kind: 'good', hoursAgo: 200 });
    } else if (job.state === 'with_customer' && job.round > 1) {
      logs.push({ job, round: job.round - 1, kind: 'lean', hoursAgo: 60 });
    }
  }
  return logs;
}

// Generating and analysing are the slow part, and API tests seed a fresh database per test: each kind of drive is
// generated and analysed once per process and shared (its file is stored once, by hash).
const generated = new Map<string, Uint8Array>();
const reports = new Map<string, DatalogReport>();

/** Generates, analyses and stores the demo logs; analysis runs here directly, as the worker would. */
export async function seedLogs(db: Db, blobs: BlobStore, jobs: SeededJob[], now: Date): Promise<number> {
  const planned = plan(jobs);
  for (const log of planned) {
    const logRequest = defaultLogRequest(log.job.vehicle.engine.family, log.round);
    const twoBanks = logRequest.channels.includes('stft_b2');
    const key = `${log.kind}|${logRequest.wotGears}|${twoBanks}`;
    const bytes = generated.get(key) ?? new TextEncoder().encode(generateLog(driveFor(log.kind, log.round, twoBanks)).text);
    generated.set(key, bytes);
    const fuel = vehicleFuelSpec(log.job.vehicle);
    const reportKey = `${key}|${JSON.stringify(fuel)}|${JSON.stringify(logRequest)}`;
    const report = reports.get(reportKey) ?? analyzeDatalog(bytes, { fuel, logRequest });
    reports.set(reportKey, report);
    const blob = await blobs.putBytes(bytes);
    const headers = detectCsvLayout(bytes).headers;
    const at = new Date(now.getTime() - log.hoursAgo * 3_600_000).toISOString();
    const name = `rev${log.round}-drive.csv`;
    const row = await insertDatalog(db, {
      id: newId(),
      shop_id: log.job.shopId,
      job_id: log.job.id,
      round: log.round,
      original_name: name,
      sha256: blob.sha256,
      size_bytes: blob.size,
      header_signature: headerSignature(headers),
      mapping: JSON.stringify({ headers, overrides: {} }),
      fuel: JSON.stringify(fuel),
      status: 'ready',
      error: null,
      report: JSON.stringify(report),
      uploaded_by: log.job.customerUserId,
      created_at: at,
    });
    await insertAuditEvent(db, {
      id: newId(),
      shop_id: log.job.shopId,
      actor_user_id: log.job.customerUserId,
      action: 'datalog.uploaded',
      subject_type: 'Job',
      subject_id: log.job.id,
      details: JSON.stringify({ datalogId: row.id, text: `Log ${name} uploaded (on revision ${log.round})` }),
      created_at: at,
    });
  }
  return planned.length;
}
