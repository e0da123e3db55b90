import { insertAuditEvent, insertDatalog, newId, type Db } from '@revloop/db';
import { analyzeDatalog, detectCsvLayout, headerSignature, type DatalogReport, type LogRequest } from '@revloop/domain/datalog';
import { vehicleFuelSpec, type VehicleInput } from '@revloop/domain/vehicles';
import { datalogVehicleOf } from '../../apps/api/src/features/datalogs/datalog.service';
import type { BlobStore } from '../../apps/api/src/storage/blob-store';
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

// Generating and analysing are the slow part, and API tests build many apps per process: a drive of one vehicle model
// is generated and analysed once and shared (its file is stored once, by hash).
const generated = new Map<string, Uint8Array>();
const reports = new Map<string, DatalogReport>();

/**
 * Stores a customer's log as the upload and the analysis worker would: the file, the row with its report, and both
 * timeline entries. The caller then records the fact and moves the job, as the worker does.
 */
export async function storeDemoLog(
  db: Db,
  blobs: BlobStore,
  input: { shopId: string; jobId: string; vehicle: VehicleInput; round: number; kind: DriveKind; logRequest: LogRequest; by: string; at: Date; name: string },
): Promise<void> {
  const { vehicle, round, kind } = input;
  const key = `${vehicle.description}|${kind}|${round > 1}`;
  let bytes = generated.get(key);
  if (!bytes) {
    bytes = new TextEncoder().encode(generateDrivingLog(vehicle, driveOptions(vehicle, kind, round, [...key].reduce((h, c) => (h * 31 + c.charCodeAt(0)) >>> 0, 7), input.logRequest.channels.includes('stft_b2'))));
    generated.set(key, bytes);
  }
  const fuel = vehicleFuelSpec(vehicle);
  const reportKey = `${key}|${JSON.stringify(input.logRequest)}`;
  let report = reports.get(reportKey);
  if (!report) {
    const gearing = datalogVehicleOf(vehicle);
    report = analyzeDatalog(bytes, { fuel, logRequest: input.logRequest, ...(gearing && { vehicle: gearing }) });
    reports.set(reportKey, report);
  }
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
