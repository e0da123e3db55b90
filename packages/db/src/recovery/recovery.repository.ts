import type { Db } from '../client';
import type { DatalogRow } from '../datalogs/datalog.table';

// Start-up recovery looks across every shop on purpose: it runs before any request, on behalf of the service.

/** Every content hash a row still points at; a blob outside this set belongs to no upload. */
export async function referencedBlobHashes(db: Db): Promise<Set<string>> {
  const rows = await db
    .selectFrom('calibration_files')
    .select('sha256')
    .union(db.selectFrom('datalogs').select('sha256'))
    .union(db.selectFrom('kit_photos').select('sha256'))
    .execute();
  return new Set(rows.map((r) => r.sha256));
}

/** Logs whose analysis never finished (still "processing"), oldest first, in every shop. */
export async function listUnfinishedDatalogs(db: Db): Promise<DatalogRow[]> {
  return db.selectFrom('datalogs').selectAll().where('status', '=', 'processing').orderBy('created_at').orderBy('id').execute();
}
