import { insertDatalog, newId, saveDatalogMapping, updateDatalog, type JobListRow } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import { safeUploadName } from '@revloop/domain/calibration';
import { headerSignature, mapHeaders, type DatalogMappingInput } from '@revloop/domain/datalog';
import type { JobState } from '@revloop/domain/jobs';
import type { AppDeps } from '../../context';
import { authorizeRow } from '../../http/auth-context';
import { writeWithAudit } from '../audit/audit.service';
import { jobSubject } from '../jobs/job.service';
import { readLogHeaders, resolveMapping, type StoredMapping } from './datalog-mapping';
import { datalogRowToDatalog } from './datalog.presenter';
import { datalogAnalyzerOf, fuelOf, loadDatalog, vehicleSpecOf, type ShopAuth } from './datalog.service';

/** A finished or cancelled job keeps its logs but takes no new ones. */
const CLOSED_STATES: readonly JobState[] = ['dialed_in', 'cancelled'];

/** Refuses before a byte is stored when the job takes no logs now. */
export function assertTakesLogs(job: JobListRow): void {
  if (CLOSED_STATES.includes(job.state)) throw new DomainError('conflict', 'This job is finished: it takes no new logs.');
}

/**
 * The log upload after multer has streamed the body to `tempFile`: read the headers (bad input is refused with its
 * reason), settle the column mapping, move the file into the blob store, write the row and the timeline event, then
 * start the analysis. Whatever is left at the temp path afterwards was refused and is removed.
 */
export async function uploadDatalog(
  deps: AppDeps,
  auth: ShopAuth,
  job: JobListRow,
  upload: { tempFile: string; originalName: string },
  own: Partial<DatalogMappingInput>,
) {
  const { db, clock, blobs } = deps;
  try {
    const originalName = safeUploadName(upload.originalName).slice(0, 200);
    const headers = await readLogHeaders(upload.tempFile);
    const signature = headerSignature(headers);
    const mapping = await resolveMapping(db, auth.shop.id, headers, signature, own);
    const spec = await vehicleSpecOf(db, job);
    const blob = await blobs.adopt(upload.tempFile);
    const row = await writeWithAudit(
      db,
      (trx) =>
        insertDatalog(trx, {
          id: newId(),
          shop_id: auth.shop.id,
          job_id: job.id,
          round: job.round,
          original_name: originalName,
          sha256: blob.sha256,
          size_bytes: blob.size,
          header_signature: signature,
          mapping: JSON.stringify(mapping),
          fuel: JSON.stringify(fuelOf(spec)),
          status: 'processing',
          error: null,
          report: null,
          uploaded_by: auth.user.id,
          created_at: clock.now().toISOString(),
        }),
      (inserted) => ({
        shopId: auth.shop.id,
        actorUserId: auth.user.id,
        action: 'datalog.uploaded',
        subjectType: 'Job',
        subjectId: job.id,
        details: { datalogId: inserted.id, text: `Log ${inserted.original_name} uploaded (on ${job.round === 0 ? 'the stock calibration' : `revision ${job.round}`})` },
        at: clock.now(),
      }),
    );
    // Queued after the row is written: the job outlives this process, and any instance may run it.
    await datalogAnalyzerOf(deps).start(row);
    return datalogRowToDatalog({ ...row, uploaded_by_name: auth.user.name }, undefined);
  } finally {
    // Adopted files were moved into the store; anything left at the temp path is a refused upload.
    await blobs.discard(upload.tempFile);
  }
}

/**
 * The user's column mapping for a log: checked against its headers, remembered for the shop's next log with the same
 * headers, and the log is analysed again with it.
 */
export async function confirmMapping(deps: AppDeps, auth: ShopAuth, datalogId: string, input: DatalogMappingInput) {
  const { db, clock } = deps;
  const { row, job } = await loadDatalog(db, auth, datalogId);
  authorizeRow(auth, 'upload', 'Job', jobSubject(job));
  if (row.status === 'processing') throw new DomainError('conflict', 'This log is still being checked. Try again in a moment.');
  const stored = JSON.parse(row.mapping) as StoredMapping;
  const units = Object.fromEntries(Object.entries(input.units ?? {}).filter(([, unit]) => unit.trim() !== ''));
  mapHeaders(stored.headers, input.channels, units);
  const mapping: StoredMapping = {
    headers: stored.headers,
    overrides: input.channels,
    units,
    ...(input.afrScale && { afrScale: input.afrScale }),
    ...(input.trimAxis && { trimAxis: input.trimAxis }),
  };
  const at = clock.now().toISOString();
  const updated = await writeWithAudit(
    db,
    async (trx) => {
      await saveDatalogMapping(trx, { shop_id: auth.shop.id, header_signature: row.header_signature, mapping: JSON.stringify({ ...input, units }), updated_at: at });
      return (await updateDatalog(trx, auth.shop.id, row.id, { mapping: JSON.stringify(mapping), status: 'processing', error: null, report: null }))!;
    },
    () => ({
      shopId: auth.shop.id,
      actorUserId: auth.user.id,
      action: 'datalog.mapping_confirmed',
      subjectType: 'Job',
      subjectId: job.id,
      details: { datalogId: row.id, text: `Column mapping of ${row.original_name} confirmed; the log is checked again` },
      at: clock.now(),
    }),
  );
  await datalogAnalyzerOf(deps).start(updated);
  return datalogRowToDatalog({ ...updated, uploaded_by_name: row.uploaded_by_name }, undefined);
}
