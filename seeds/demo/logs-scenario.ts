import { createHash } from 'node:crypto';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { fileURLToPath } from 'node:url';
import { insertAuditEvent, insertDatalog, newId, type Db } from '@revloop/db';
import { analyzeDatalog, detectCsvLayout, headerSignature, type DatalogReport, type LogRequest } from '@revloop/domain/datalog';
import { vehicleFuelSpec, type VehicleInput } from '@revloop/domain/vehicles';
import { datalogVehicleOf, type DiskBlobStore } from '@revloop/api';
import { generateDrivingLog, pullGears, type DrivingLogOptions } from './driving-log';

/** What went on in the drive: most logs are clean, some run lean in places, one knocks, one has a half-pressed pedal. */
export type DriveKind = 'good' | 'lean' | 'knock' | 'half_pedal';

function driveOptions(vehicle: VehicleInput, kind: DriveKind, round: number, seed: number, twoBanks: boolean): DrivingLogOptions {
  const base: DrivingLogOptions = { seed, wotGears: pullGears(vehicle, round), twoBanks };
  switch (kind) {
    case 'lean':
      return { ...base, leanWot: { aboveRpm: 0.7 * vehicle.revLimitRpm, errorPct: 4.5 }, leanCell: { rpm: [1500, 2500], map: [40, 60], trimPct: 7 } };
    case 'knock':
      return { ...base, knock: { atFraction: 0.65, peakDeg: 4.5 } };
    case 'half_pedal':
      return { ...base, pedalPct: 62 };
    case 'good':
      return base;
  }
}

// Generating and analysing are the slow part, and every demo start, browser-test server and API test process seeds
// anew: each drive is made once per vehicle model and kept, with its report, in memory and in a cache folder keyed by
// the inputs and the source of the generator and the analysis, so a change to either makes it anew.
const memory = new Map<string, { bytes: Uint8Array; report: DatalogReport }>();
const CACHE_DIR = path.join(os.tmpdir(), 'revloop-demo-logs');
let sourceHash: string | undefined;

function codeVersion(): string {
  if (sourceHash === undefined) {
    const here = path.dirname(fileURLToPath(import.meta.url));
    const analysis = path.dirname(fileURLToPath(import.meta.resolve('@revloop/domain/datalog')));
    const files = [path.join(here, 'driving-log.ts'), ...fs.readdirSync(analysis).filter((f) => f.endsWith('.ts')).sort().map((f) => path.join(analysis, f))];
    const hash = createHash('sha256');
    for (const file of files) hash.update(fs.readFileSync(file));
    sourceHash = hash.digest('hex');
  }
  return sourceHash;
}

function cachedDrive(key: string, make: () => { bytes: Uint8Array; report: DatalogReport }) {
  let drive = memory.get(key);
  if (drive) return drive;
  const name = createHash('sha256').update(`${codeVersion()}|${key}`).digest('hex');
  const csv = path.join(CACHE_DIR, `${name}.csv`);
  const json = path.join(CACHE_DIR, `${name}.json`);
  try {
    drive = { bytes: new Uint8Array(fs.readFileSync(csv)), report: JSON.parse(fs.readFileSync(json, 'utf8')) as DatalogReport };
  } catch {
    drive = make();
    // Written to a temporary name and renamed, so a seed running alongside never reads half a file.
    fs.mkdirSync(CACHE_DIR, { recursive: true });
    for (const [target, data] of [[csv, drive.bytes], [json, JSON.stringify(drive.report)]] as const) {
      const temp = `${target}.${process.pid}.tmp`;
      fs.writeFileSync(temp, data);
      fs.renameSync(temp, target);
    }
  }
  memory.set(key, drive);
  return drive;
}

/**
 * Stores a customer's log as the upload and the analysis worker would: the file, the row with its report, and both
 * timeline entries. The caller then records the fact and moves the job, as the worker does.
 */
export async function storeDemoLog(
  db: Db,
  blobs: DiskBlobStore,
  input: { shopId: string; jobId: string; vehicle: VehicleInput; round: number; kind: DriveKind; logRequest: LogRequest; by: string; at: Date; name: string },
): Promise<void> {
  const { vehicle, round, kind } = input;
  const fuel = vehicleFuelSpec(vehicle);
  const twoBanks = input.logRequest.channels.includes('stft_b2');
  // One drive per vehicle model: the VIN and model year do not change how it drives.
  const { description, engine, transmission, finalDrive, tyreSize, curbMassKg, revLimitRpm } = vehicle;
  const key = JSON.stringify({ description, engine, transmission, finalDrive, tyreSize, curbMassKg, revLimitRpm, kind, later: round > 1, fuel, logRequest: input.logRequest });
  const { bytes, report } = cachedDrive(key, () => {
    const seed = [...vehicle.description, kind].reduce((h, c) => (Math.imul(h, 31) + c.charCodeAt(0)) >>> 0, 7);
    const text = new TextEncoder().encode(generateDrivingLog(vehicle, driveOptions(vehicle, kind, round, seed, twoBanks)));
    const gearing = datalogVehicleOf(vehicle);
    return { bytes: text, report: analyzeDatalog(text, { fuel, logRequest: input.logRequest, ...(gearing && { vehicle: gearing }) }) };
  });
  const blob = await blobs.putBytes(bytes);
  const headers = detectCsvLayout(bytes).headers;
  const id = newId();
  const at = input.at.toISOString();
  await insertDatalog(db, {
    id,
    shop_id: input.shopId,
    job_id: input.jobId,
    round,
    original_name: input.name,
    sha256: blob.sha256,
    size_bytes: blob.size,
    header_signature: headerSignature(headers),
    mapping: JSON.stringify({ headers, overrides: {} }),
    fuel: JSON.stringify(fuel),
    status: 'ready',
    error: null,
    report: JSON.stringify(report),
    uploaded_by: input.by,
    created_at: at,
  });
  const fails = report.checks.filter((c) => c.status === 'fail').length;
  for (const [action, text, when] of [
    ['datalog.uploaded', `Log ${input.name} uploaded (on revision ${round})`, at],
    ['datalog.analysed', `Log ${input.name} checked: ${fails === 0 ? 'usable' : `${fails} check${fails === 1 ? '' : 's'} failed`}`, new Date(input.at.getTime() + 20_000).toISOString()],
  ] as const) {
    await insertAuditEvent(db, { id: newId(), shop_id: input.shopId, actor_user_id: input.by, action, subject_type: 'Job', subject_id: input.jobId, details: JSON.stringify({ datalogId: id, text }), created_at: when });
  }
}
