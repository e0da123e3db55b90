import { insertAuditEvent, newId, type Db } from '@revloop/db';

export interface AuditInput {
  shopId: string | null;
  actorUserId: string | null;
  action: string;
  subjectType: string;
  subjectId?: string | null;
  details?: Record<string, unknown>;
  at: Date;
}

/** Every change that matters leaves one row here; the job page and the owner's log read them back. Returns its id. */
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
