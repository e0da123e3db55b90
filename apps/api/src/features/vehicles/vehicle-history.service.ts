import { findJob, listJobDatalogs, listJobFiles, listVehicleJobIds, type CalibrationFileListRow, type Db, type JobListRow } from '@revloop/db';
import type { VehicleHistoryEvent } from '@revloop/contract';
import { jobScopeFor } from '@revloop/domain/auth';
import type { AuthContext } from '../../http/auth-context';
import { canSeeFile } from '../files/file.service';
import { readPlausibilityForJob } from './read-plausibility.service';

type ShopAuth = AuthContext & { shop: { id: string; settings: string } };

interface CheckLike {
  id: string;
  status: 'pass' | 'warn' | 'fail';
  message: string;
}

/**
 * The vehicle's history across the jobs this viewer may see, newest first: reads with their size check, revisions
 * with their notes, re-reads with the revision they prove is on the car, and logs with their check results.
 */
export async function vehicleHistory(db: Db, auth: ShopAuth, vehicleId: string): Promise<VehicleHistoryEvent[]> {
  const events: VehicleHistoryEvent[] = [];
  const scope = jobScopeFor(auth.actor);
  for (const jobId of await listVehicleJobIds(db, auth.shop.id, vehicleId)) {
    const job = await findJob(db, auth.shop.id, jobId, scope);
    if (!job) continue;
    const ref = { id: job.id, number: job.number };
    const files = (await listJobFiles(db, auth.shop.id, job.id)).filter((f) => canSeeFile(auth, f, job));
    const plausibility = await readPlausibilityForJob(db, auth.shop, job);
    for (const f of files) events.push(fileEvent(f, files, job, ref, plausibility));
    for (const log of await listJobDatalogs(db, auth.shop.id, job.id)) {
      const report = log.report ? (JSON.parse(log.report) as { checks?: CheckLike[] }) : null;
      events.push({
        kind: 'log',
        datalogId: log.id,
        name: log.original_name,
        round: log.round,
        status: log.status,
        checks: (report?.checks ?? []).map((c) => ({ id: c.id, status: c.status, message: c.message })),
        at: log.created_at,
        job: ref,
      });
    }
  }
  return events.sort((a, b) => (a.at < b.at ? 1 : a.at > b.at ? -1 : 0));
}

function fileEvent(
  f: CalibrationFileListRow,
  files: CalibrationFileListRow[],
  job: JobListRow,
  ref: { id: string; number: number },
  plausibility: Awaited<ReturnType<typeof readPlausibilityForJob>>,
): VehicleHistoryEvent {
  const base = { fileId: f.id, module: f.module, name: f.original_name, imageBytes: f.image_bytes, crc32: f.crc32, by: f.uploaded_by_name, at: f.created_at, job: ref };
  if (f.kind === 'revision') return { ...base, kind: 'revision', revisionNumber: f.revision_number, notes: f.notes };
  if (f.kind === 'read') return { ...base, kind: 'read', plausibility: plausibility(f)! };
  // A flash is proven when a later re-read has the same image (CRC-32 and size) as a revision sent for this module.
  const proven = files.find(
    (r) => r.kind === 'revision' && r.module === f.module && (r.for_round ?? 0) <= job.round && r.crc32 === f.crc32 && r.image_bytes === f.image_bytes,
  );
  return { ...base, kind: 're_read', proves: proven ? { fileId: proven.id, revisionNumber: proven.revision_number } : null };
}
