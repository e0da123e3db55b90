import type { Db } from '../client';
import { newId } from '../ids';
import type { QueueJobRow, QueueJobState } from './shared-state.table';

/**
 * Adds a job unless one for the same queue and key is still queued or running (a unique partial index decides, so
 * two instances enqueueing the same work at once add one job). Returns whether a job was added.
 */
export async function enqueueQueueJob(db: Db, job: { queue: string; key: string; payload: unknown; maxAttempts: number; at: Date; runAfter?: Date }): Promise<boolean> {
  const at = job.at.toISOString();
  const result = await db
    .insertInto('queue_jobs')
    .values({
      id: newId(),
      queue: job.queue,
      key: job.key,
      payload: JSON.stringify(job.payload ?? null),
      state: 'queued',
      attempts: 0,
      max_attempts: job.maxAttempts,
      run_after: (job.runAfter ?? job.at).toISOString(),
      lease_until: null,
      locked_by: null,
      last_error: null,
      created_at: at,
      updated_at: at,
    })
    .onConflict((oc) => oc.doNothing())
    .executeTakeFirst();
  return Number(result.numInsertedOrUpdatedRows ?? 0) === 1;
}

/**
 * Claims the next due job of a queue for `worker` until `leaseUntil`: a queued job whose time has come, or a running
 * one whose lease lapsed (its worker died). The claim is a conditional update, so exactly one worker wins a job.
 */
export async function claimQueueJob(db: Db, queue: string, worker: string, now: Date, leaseUntil: Date): Promise<QueueJobRow | undefined> {
  const at = now.toISOString();
  for (let tries = 0; tries < 5; tries++) {
    const candidate = await db
      .selectFrom('queue_jobs')
      .select('id')
      .where('queue', '=', queue)
      .where((eb) => eb.or([eb.and([eb('state', '=', 'queued'), eb('run_after', '<=', at)]), eb.and([eb('state', '=', 'running'), eb('lease_until', '<', at)])]))
      .orderBy('run_after')
      .limit(1)
      .executeTakeFirst();
    if (!candidate) return undefined;
    const claimed = await db
      .updateTable('queue_jobs')
      .set((eb) => ({ state: 'running', attempts: eb('attempts', '+', 1), lease_until: leaseUntil.toISOString(), locked_by: worker, updated_at: at }))
      .where('id', '=', candidate.id)
      .where((eb) => eb.or([eb.and([eb('state', '=', 'queued'), eb('run_after', '<=', at)]), eb.and([eb('state', '=', 'running'), eb('lease_until', '<', at)])]))
      .executeTakeFirst();
    if (Number(claimed.numUpdatedRows) === 1) return db.selectFrom('queue_jobs').selectAll().where('id', '=', candidate.id).executeTakeFirst();
  }
  return undefined;
}

/** Extends the lease of a job this worker still holds; false when it lost the job (lease lapsed and taken over). */
export async function extendQueueLease(db: Db, id: string, worker: string, leaseUntil: Date): Promise<boolean> {
  const result = await db
    .updateTable('queue_jobs')
    .set({ lease_until: leaseUntil.toISOString() })
    .where('id', '=', id)
    .where('locked_by', '=', worker)
    .where('state', '=', 'running')
    .executeTakeFirst();
  return Number(result.numUpdatedRows) === 1;
}

/** Ends a job this worker holds: done, failed for good, or back in the queue until `retryAt`. */
export async function finishQueueJob(db: Db, id: string, worker: string, outcome: { state: 'done' } | { state: 'failed'; error: string } | { state: 'queued'; error: string; retryAt: Date }, at: Date): Promise<boolean> {
  const result = await db
    .updateTable('queue_jobs')
    .set({
      state: outcome.state,
      lease_until: null,
      locked_by: null,
      updated_at: at.toISOString(),
      ...(outcome.state !== 'done' && { last_error: outcome.error }),
      ...(outcome.state === 'queued' && { run_after: outcome.retryAt.toISOString() }),
    })
    .where('id', '=', id)
    .where('locked_by', '=', worker)
    .where('state', '=', 'running')
    .executeTakeFirst();
  return Number(result.numUpdatedRows) === 1;
}

export async function listQueueJobs(db: Db, queue: string, states?: QueueJobState[]): Promise<QueueJobRow[]> {
  let query = db.selectFrom('queue_jobs').selectAll().where('queue', '=', queue);
  if (states?.length) query = query.where('state', 'in', states);
  return query.orderBy('created_at').execute();
}

/** Removes finished jobs older than `before`. */
export async function pruneQueueJobs(db: Db, before: Date): Promise<void> {
  await db.deleteFrom('queue_jobs').where('state', 'in', ['done', 'failed']).where('updated_at', '<', before.toISOString()).execute();
}
