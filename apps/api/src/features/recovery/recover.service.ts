import { listUnfinishedDatalogs, referencedBlobHashes, updateDatalog } from '@revloop/db';
import type { AppDeps } from '../../context';
import { loadAuthContext } from '../../http/auth-context';
import { datalogAnalyzerOf } from '../datalogs/datalog.service';

/** A blob younger than this may belong to an upload whose row is still being written, so it is left alone. */
export const ORPHAN_MIN_AGE_MS = 3_600_000;

export interface RecoveryCounts {
  tempFiles: number;
  tempBytes: number;
  datalogsRequeued: number;
  /** Unfinished logs whose uploader is no longer an active member: marked failed, since nobody can act for them. */
  datalogsFailed: number;
  orphanBlobs: number;
  orphanBytes: number;
}

export interface Recovery {
  counts: RecoveryCounts;
  /** Settles when every re-queued analysis has finished, on whichever instance ran it (tests wait on it; the server does not). */
  analyses: Promise<void>;
}

/**
 * Makes sure every log left "processing" has an analysis job in the durable queue. A job the crashed process held is
 * still in the queue and is taken over once its lease lapses; a log whose job was lost gets a new one. Logs whose
 * uploader left the shop are failed here, since nobody can act for them.
 */
async function requeueUnfinishedDatalogs(deps: AppDeps) {
  const analyzer = datalogAnalyzerOf(deps);
  const requeued: string[] = [];
  let failed = 0;
  for (const row of await listUnfinishedDatalogs(deps.db)) {
    const auth = row.uploaded_by ? await loadAuthContext(deps.db, 'start-up-recovery', row.uploaded_by, row.shop_id) : null;
    if (auth?.shop) {
      await analyzer.start(row);
      requeued.push(row.id);
      continue;
    }
    await updateDatalog(deps.db, row.shop_id, row.id, {
      status: 'failed',
      error: 'The check was cut off by a restart and its uploader is no longer a member of the shop. Upload the log again.',
      report: null,
    });
    failed += 1;
  }
  return { requeued: requeued.length, failed, analyses: requeued.length ? analyzer.settled(requeued) : Promise.resolve() };
}

/** Deletes blobs that no row references and that are older than ORPHAN_MIN_AGE_MS (an upload cut between file and row). */
async function sweepOrphanBlobs(deps: AppDeps) {
  const referenced = await referencedBlobHashes(deps.db);
  const cutoff = deps.clock.now().getTime() - ORPHAN_MIN_AGE_MS;
  let blobs = 0;
  let bytes = 0;
  for await (const blob of deps.blobs.list()) {
    if (referenced.has(blob.sha256) || blob.mtimeMs > cutoff) continue;
    await deps.blobs.remove(blob.sha256);
    blobs += 1;
    bytes += blob.size;
  }
  return { blobs, bytes };
}

/**
 * What a crash can leave behind, cleaned before the server takes requests: half-received uploads in the temp
 * folder, logs whose analysis was cut off, and stored files whose row was never written. One log line says what.
 */
export async function recoverAtStartup(deps: AppDeps): Promise<Recovery> {
  const temp = await deps.blobs.clearTemp();
  const logs = await requeueUnfinishedDatalogs(deps);
  const orphans = await sweepOrphanBlobs(deps);
  const counts: RecoveryCounts = {
    tempFiles: temp.files,
    tempBytes: temp.bytes,
    datalogsRequeued: logs.requeued,
    datalogsFailed: logs.failed,
    orphanBlobs: orphans.blobs,
    orphanBytes: orphans.bytes,
  };
  deps.logger.info(counts, 'start-up recovery');
  return { counts, analyses: logs.analyses };
}
