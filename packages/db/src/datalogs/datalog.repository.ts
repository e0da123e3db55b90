import type { Db } from '../client';
import type { DatalogMappingRow, DatalogRow, InsertableDatalogRow, UpdateableDatalogRow } from './datalog.table';

/** A log with the name of the member who uploaded it. */
export type DatalogListRow = DatalogRow & { uploaded_by_name: string | null };

function withUploader(db: Db, shopId: string) {
  return db
    .selectFrom('datalogs')
    .leftJoin('users', 'users.id', 'datalogs.uploaded_by')
    .selectAll('datalogs')
    .select('users.name as uploaded_by_name')
    .where('datalogs.shop_id', '=', shopId);
}

export async function insertDatalog(db: Db, row: InsertableDatalogRow): Promise<DatalogRow> {
  return db.insertInto('datalogs').values(row).returningAll().executeTakeFirstOrThrow();
}

/** One log of this shop; another shop's id reads as undefined. */
export async function findDatalog(db: Db, shopId: string, id: string): Promise<DatalogListRow | undefined> {
  return withUploader(db, shopId).where('datalogs.id', '=', id).executeTakeFirst();
}

/** A job's logs, newest first. */
export async function listJobDatalogs(db: Db, shopId: string, jobId: string): Promise<DatalogListRow[]> {
  return withUploader(db, shopId)
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
