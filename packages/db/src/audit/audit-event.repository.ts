import type { Db } from '../client';
import type { AuditEventRow, InsertableAuditEventRow } from './audit-event.table';

export async function insertAuditEvent(db: Db, row: InsertableAuditEventRow): Promise<void> {
  await db.insertInto('audit_events').values(row).execute();
}

export interface AuditEventListRow extends AuditEventRow {
  actor_name: string | null;
}

export interface AuditEventFilter {
  subjectType?: string;
  subjectId?: string;
  limit?: number;
}

/** Newest first; one subject's events are read through the (shop, subject, time) index, never the shop's history. */
export function listAuditEventsQuery(db: Db, shopId: string, filter: AuditEventFilter = {}) {
  let query = db
    .selectFrom('audit_events')
    .leftJoin('users', 'users.id', 'audit_events.actor_user_id')
    .selectAll('audit_events')
    .select('users.name as actor_name')
    .where('audit_events.shop_id', '=', shopId);
  if (filter.subjectType) query = query.where('audit_events.subject_type', '=', filter.subjectType);
  if (filter.subjectId) query = query.where('audit_events.subject_id', '=', filter.subjectId);
  return query.orderBy('audit_events.created_at', 'desc').limit(filter.limit ?? 100);
}

export async function listAuditEvents(db: Db, shopId: string, filter: AuditEventFilter = {}): Promise<AuditEventListRow[]> {
  return listAuditEventsQuery(db, shopId, filter).execute();
}
