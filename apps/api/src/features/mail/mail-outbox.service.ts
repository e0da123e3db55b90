import { claimQueuedMail, listQueuedMails, markMailFailed, newId, queueMails, removeQueuedMail, type Db } from '@revloop/db';
import type { WorkQueue } from '../../queue/work-queue';
import type { Mailer, OutgoingMail } from './mailer';

const BATCH = 100;
/** A claim this old belongs to a drain that died mid-send; another drain may take the mail over. */
const CLAIM_STALE_MS = 5 * 60_000;

/** Queues e-mails in the caller's transaction; `drainMailOutbox` sends them once it has committed. */
export async function queueMail(db: Db, mails: OutgoingMail[], at: Date): Promise<void> {
  await queueMails(
    db,
    mails.map((mail) => ({
      id: newId(),
      to_address: Array.isArray(mail.to) ? JSON.stringify(mail.to) : mail.to,
      subject: mail.subject,
      text: mail.text,
      html: mail.html ?? null,
      attempts: 0,
      created_at: at.toISOString(),
    })),
  );
}

/**
 * Sends every queued e-mail through the mailer, oldest first, removing each once sent. One that fails stays queued
 * with its error and goes out on a later drain; the change that queued it has committed either way.
 */
export async function drainMailOutbox(deps: { db: Db; mailer: Mailer; clock: { now(): Date } }): Promise<void> {
  const { db, mailer, clock } = deps;
  for (;;) {
    const rows = await listQueuedMails(db, BATCH);
    let sent = 0;
    for (const row of rows) {
      const now = clock.now();
      if (!(await claimQueuedMail(db, row.id, now.toISOString(), new Date(now.getTime() - CLAIM_STALE_MS).toISOString()))) continue;
      try {
        const to = row.to_address.startsWith('[') ? (JSON.parse(row.to_address) as string[]) : row.to_address;
        await mailer.send({ to, subject: row.subject, text: row.text, ...(row.html !== null && { html: row.html }) });
      } catch (error) {
        await markMailFailed(db, row.id, error instanceof Error ? error.message : String(error));
        continue;
      }
      await removeQueuedMail(db, row.id);
      sent += 1;
    }
    // Stop when nothing more went out: the rest failed or another drain holds it.
    if (rows.length < BATCH || sent === 0) return;
  }
}

export const MAIL_QUEUE = 'mail-outbox';

/**
 * The outbox sweep as a job of the durable queue: requests drain the outbox right after their change commits; this job
 * (queued once a minute by the server, one open job per key) sends what a crashed or failed drain left, on any instance.
 */
export function registerMailOutboxJob(deps: { db: Db; mailer: Mailer; clock: { now(): Date }; queue: { register: WorkQueue['register'] } }): void {
  deps.queue.register(MAIL_QUEUE, { maxAttempts: 3, run: () => drainMailOutbox(deps) });
}
