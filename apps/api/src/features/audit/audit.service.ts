import { inTransaction, insertAuditEvent, newId, type Db } from '@revloop/db';

export interface AuditInput {
  shopId: string | null;
  actorUserId: string | null;
  action: string;
  subjectType: string;
  subjectId?: string | null;
  details?: Record<string, unknown>;
  at: Date;
}

/**
 * Every change that matters leaves one row here; the job page and the owner's log read them back. Returns its id.
 * Call it on the change's transaction (`writeWithAudit`, or inside the caller's `inTransaction`), never after a
 * separate write: a failure between the two would leave a change with no trail.
 */
export async function recordAudit(db: Db, input: AuditInput): Promise<string> {
  const id = newId();
  await insertAuditEvent(db, {
    id,
    shop_id: input.shopId,
    actor_user_id: input.actorUserId,
    action: input.action,
    subject_type: input.subjectType,
    subject_id: input.subjectId ?? null,
    details: JSON.stringify(input.details ?? {}),
    created_at: input.at.toISOString(),
  });
  return id;
}

/**
 * Runs a write and records the audit event(s) it names in one transaction (the caller's, when `db` already is one):
 * both commit or neither does. Mail, blob files and payment-provider calls stay outside, before or after it.
 */
export async function writeWithAudit<T>(db: Db, write: (trx: Db) => Promise<T>, audit: (result: T) => AuditInput | AuditInput[]): Promise<T> {
  return inTransaction(db, async (trx) => {
    const result = await write(trx);
    for (const event of [audit(result)].flat()) await recordAudit(trx, event);
    return result;
  });
}
