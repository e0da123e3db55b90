import type { Db } from '../client';
import type { CalibrationFileRow, CalibrationModule, InsertableCalibrationFileRow } from './calibration-file.table';

export interface CalibrationFileListRow extends CalibrationFileRow {
  uploaded_by_name: string;
  approved_by_name: string | null;
}

function withUploader(db: Db, shopId: string) {
  return db
    .selectFrom('calibration_files')
    .innerJoin('users', 'users.id', 'calibration_files.uploaded_by_user_id')
    .leftJoin('users as approver', 'approver.id', 'calibration_files.approved_by_user_id')
    .selectAll('calibration_files')
    .select(['users.name as uploaded_by_name', 'approver.name as approved_by_name'])
    .where('calibration_files.shop_id', '=', shopId);
}

export async function insertCalibrationFile(db: Db, row: InsertableCalibrationFileRow): Promise<CalibrationFileRow> {
  return db.insertInto('calibration_files').values(row).returningAll().executeTakeFirstOrThrow();
}

/** One file of this shop; another shop's file reads as undefined. */
export async function findCalibrationFile(db: Db, shopId: string, id: string): Promise<CalibrationFileListRow | undefined> {
  return withUploader(db, shopId).where('calibration_files.id', '=', id).executeTakeFirst();
}

/** A job's files, oldest first; files of the same moment by module (neither engine keeps insertion order for ties). */
export async function listJobFiles(db: Db, shopId: string, jobId: string): Promise<CalibrationFileListRow[]> {
  return withUploader(db, shopId)
    .where('calibration_files.job_id', '=', jobId)
    .orderBy('calibration_files.created_at')
    .orderBy('calibration_files.revision_number')
    .orderBy('calibration_files.module')
    .orderBy('calibration_files.id')
    .execute();
}

/** The highest-numbered revision of a job's module: the one the shop believes is on the car once sent. */
export async function latestRevision(db: Db, shopId: string, jobId: string, module: CalibrationModule): Promise<CalibrationFileRow | undefined> {
  return db
    .selectFrom('calibration_files')
    .selectAll()
    .where('shop_id', '=', shopId)
    .where('job_id', '=', jobId)
    .where('module', '=', module)
    .where('kind', '=', 'revision')
    .orderBy('revision_number', 'desc')
    .limit(1)
    .executeTakeFirst();
}

/** The newest read (not re-read) of a job's module: the parent of its first revision. */
export async function latestRead(db: Db, shopId: string, jobId: string, module: CalibrationModule): Promise<CalibrationFileRow | undefined> {
  return db
    .selectFrom('calibration_files')
    .selectAll()
    .where('shop_id', '=', shopId)
    .where('job_id', '=', jobId)
    .where('module', '=', module)
    .where('kind', '=', 'read')
    .orderBy('created_at', 'desc')
    .limit(1)
    .executeTakeFirst();
}

/** Modules that have a revision made for `round`. */
export async function modulesRevisedForRound(db: Db, shopId: string, jobId: string, round: number): Promise<CalibrationModule[]> {
  const rows = await db
    .selectFrom('calibration_files')
    .select('module')
    .distinct()
    .where('shop_id', '=', shopId)
    .where('job_id', '=', jobId)
    .where('kind', '=', 'revision')
    .where('for_round', '=', round)
    .execute();
  return rows.map((r) => r.module);
}

/** Revision drafts made for `round` that still wait for a second person's approval. */
export async function countDraftsAwaitingApproval(db: Db, shopId: string, jobId: string, round: number): Promise<number> {
  const row = await db
    .selectFrom('calibration_files')
    .select((eb) => eb.fn.countAll<number>().as('n'))
    .where('shop_id', '=', shopId)
    .where('job_id', '=', jobId)
    .where('kind', '=', 'revision')
    .where('for_round', '=', round)
    .where('approval_required', '=', 1)
    .where('approved_by_user_id', 'is', null)
    .executeTakeFirstOrThrow();
  return Number(row.n);
}

/** Approves a draft once: false when it was already approved (or is not this shop's). */
export async function approveRevisionDraft(db: Db, shopId: string, fileId: string, userId: string, at: string): Promise<boolean> {
  const result = await db
    .updateTable('calibration_files')
    .set({ approved_by_user_id: userId, approved_at: at })
    .where('shop_id', '=', shopId)
    .where('id', '=', fileId)
    .where('approved_by_user_id', 'is', null)
    .executeTakeFirst();
  return Number(result.numUpdatedRows) === 1;
}

/** Stores the "what changed" note and the moment on every revision a send puts out (those made for `round`). */
export async function markRevisionsSent(db: Db, shopId: string, jobId: string, round: number, note: string, at: string): Promise<void> {
  await db
    .updateTable('calibration_files')
    .set({ sent_at: at, send_note: note })
    .where('shop_id', '=', shopId)
    .where('job_id', '=', jobId)
    .where('kind', '=', 'revision')
    .where('for_round', '=', round)
    .execute();
}

export interface ImageMatchRow {
  id: string;
  job_id: string;
  job_number: number;
  module: CalibrationModule;
  revision_number: number | null;
}

/** Revisions of OTHER jobs in the shop whose image has this CRC-32 and size: candidates for a moved or non-stock file. */
export async function findRevisionsWithImage(
  db: Db,
  shopId: string,
  image: { crc32: number; imageBytes: number },
  exceptJobId: string,
): Promise<ImageMatchRow[]> {
  return db
    .selectFrom('calibration_files')
    .innerJoin('jobs', 'jobs.id', 'calibration_files.job_id')
    .select([
      'calibration_files.id',
      'calibration_files.job_id',
      'jobs.number as job_number',
      'calibration_files.module',
      'calibration_files.revision_number',
    ])
    .where('calibration_files.shop_id', '=', shopId)
    .where('jobs.shop_id', '=', shopId)
    .where('calibration_files.kind', '=', 'revision')
    .where('calibration_files.crc32', '=', image.crc32)
    .where('calibration_files.image_bytes', '=', image.imageBytes)
    .where('calibration_files.job_id', '<>', exceptJobId)
    .orderBy('jobs.number')
    .execute();
}
