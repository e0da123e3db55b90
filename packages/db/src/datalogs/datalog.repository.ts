import type { Db } from '../client';
import type { DatalogMappingRow, DatalogRow, InsertableDatalogRow, UpdateableDatalogRow } from './datalog.table';

/** Listing columns: everything but the report JSON, which can be large. */
const SUMMARY_COLUMNS = [
  'id',
  'shop_id',
  'job_id',
  'round',
  'original_name',
  'sha256',
  'size_bytes',
  'header_signature',
  'mapping',
  'fuel',
  'status',
  'error',
  'uploaded_by',
  'created_at',
] as const;
export type DatalogSummaryRow = Omit<DatalogRow, 'report'> & { uploaded_by_name: string | null };

export async function insertDatalog(db: Db, row: InsertableDatalogRow): Promise<DatalogRow> {
  return db.insertInto('datalogs').values(row).returningAll().executeTakeFirstOrThrow();
}

/** One log of this shop; another shop's id reads as undefined. */
export async function findDatalog(db: Db, shopId: string, id: string): Promise<DatalogRow | undefined> {
  return db.selectFrom('datalogs').selectAll().where('shop_id', '=', shopId).where('id', '=', id).executeTakeFirst();
}

/** A job's logs, newest first, without their reports. */
export async function listJobDatalogs(db: Db, shopId: string, jobId: string): Promise<DatalogSummaryRow[]> {
  return db
    .selectFrom('datalogs')
    .leftJoin('users', 'users.id', 'datalogs.uploaded_by')
    .select(SUMMARY_COLUMNS.map((c) => `datalogs.${c}` as const))
    .select('users.name as uploaded_by_name')
    .where('datalogs.shop_id', '=', shopId)
    .where('datalogs.job_id', '=', jobId)
    .orderBy('datalogs.created_at', 'desc')
    .orderBy('datalogs.id')
    .execute();
}

export async function updateDatalog(db: Db, shopId: string, id: string, patch: UpdateableDatalogRow): Promise<DatalogRow | undefined> {
  return db.updateTable('datalogs').set(patch).where('shop_id', '=', shopId).where('id', '=', id).returningAll().executeTakeFirst();
}

export async function findDatalogMapping(db: Db, shopId: string, headerSignature: string): Promise<DatalogMappingRow | undefined> {
  return db
    .selectFrom('datalog_mappings')
    .selectAll()
    .where('shop_id', '=', shopId)
    .where('header_signature', '=', headerSignature)
    .executeTakeFirst();
}

/** Remembers a confirmed mapping for this shop and header set, replacing an earlier one. */
export async function saveDatalogMapping(db: Db, row: DatalogMappingRow): Promise<void> {
  await db
    .insertInto('datalog_mappings')
    .values(row)
    .onConflict((oc) => oc.columns(['shop_id', 'header_signature']).doUpdateSet({ mapping: row.mapping, updated_at: row.updated_at }))
    .execute();
}
