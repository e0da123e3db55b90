import type { Db } from '../client';
import type { InsertableMailOutboxRow, MailOutboxRow } from './mail-outbox.table';

/** Queues e-mails; call it inside the transaction of the change they report. */
export async function queueMails(db: Db, rows: InsertableMailOutboxRow[]): Promise<void> {
  if (rows.length) await db.insertInto('mail_outbox').values(rows).execute();
}

/** The oldest queued e-mails, first queued first. */
export async function listQueuedMails(db: Db, limit: number): Promise<MailOutboxRow[]> {
  return db.selectFrom('mail_outbox').selectAll().orderBy('created_at').orderBy('id').limit(limit).execute();
}

/**
 * Claims a queued e-mail for sending: true for exactly one caller. A claim older than `staleBefore` is taken over,
 * so a drain that died mid-send does not hold its mail forever.
 */
export async function claimQueuedMail(db: Db, id: string, at: string, staleBefore: string): Promise<boolean> {
  const result = await db
    .updateTable('mail_outbox')
    .set({ claimed_at: at })
    .where('id', '=', id)
    .where((eb) => eb.or([eb('claimed_at', 'is', null), eb('claimed_at', '<', staleBefore)]))
    .executeTakeFirst();
  return Number(result.numUpdatedRows) === 1;
}

export async function removeQueuedMail(db: Db, id: string): Promise<void> {
  await db.deleteFrom('mail_outbox').where('id', '=', id).execute();
}

export async function markMailFailed(db: Db, id: string, error: string): Promise<void> {
  await db
    .updateTable('mail_outbox')
    .set((eb) => ({ attempts: eb('attempts', '+', 1), last_error: error, claimed_at: null }))
    .where('id', '=', id)
    .execute();
}
