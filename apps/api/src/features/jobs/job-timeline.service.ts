import { listAuditEvents, listJobFiles, type Db, type JobListRow } from '@revloop/db';
import { SYSTEM_ACTOR_NAME, asSubject } from '@revloop/domain/auth';
import { JOB_STATE_LABELS, type JobState } from '@revloop/domain/jobs';
import type { AuthContext } from '../../http/auth-context';
import { canSeeFile } from '../files/file.service';

const TIMELINE_TEXT: Record<string, (d: Record<string, unknown>) => string> = {
  'job.opened': () => 'Job opened',
  'job.moved': (d) =>
    `Moved from ${JOB_STATE_LABELS[d.from as JobState] ?? d.from} to ${JOB_STATE_LABELS[d.to as JobState] ?? d.to}${typeof d.note === 'string' ? ` — what changed: ${d.note}` : ''}`,
  'job.assigned': (d) => (d.tunerId ? 'Tuner assigned' : 'Tuner unassigned'),
  'job.taken': () => 'Taken by a tuner',
  'job.log_request_changed': () => 'Log request changed',
};

/**
 * The job's audit trail as this viewer may see it, newest first: events about a file they may not see yet (a
 * revision not sent) are left out by the files list's own rule, and a dealer debit loses its wholesale amount
 * for anyone who may not read that dealer's ledger (the dealer's customers); approvals of drafts are the staff's alone. Events with no person behind them are
 * the system actor's, shown as Revloop.
 */
export async function timelineFor(db: Db, auth: AuthContext & { shop: { id: string } }, job: JobListRow) {
  const events = await listAuditEvents(db, auth.shop.id, { subjectType: 'Job', subjectId: job.id, limit: 500 });
  const files = new Map((await listJobFiles(db, auth.shop.id, job.id)).map((row) => [row.id, row]));
  const mayReadApprovals = auth.ability.can('read', asSubject('Approval', { shopId: job.shop_id }));
  const mayReadLedger = job.dealer_id !== null && auth.ability.can('read', asSubject('Ledger', { shopId: job.shop_id, dealerId: job.dealer_id }));
  return events
    .flatMap((e) => {
      const details = JSON.parse(e.details) as Record<string, unknown>;
      if (e.action === 'revision.approved' && !mayReadApprovals) return [];
      if (typeof details.fileId === 'string') {
        const file = files.get(details.fileId);
        if (!file || !canSeeFile(auth, file, job)) return [];
      }
      const text =
        e.action === 'ledger.job_debit' && !mayReadLedger
          ? `Paid by ${job.dealer_name ?? 'the dealer'}`
          : (TIMELINE_TEXT[e.action]?.(details) ?? (typeof details.text === 'string' ? details.text : e.action));
      return [{ id: e.id, at: e.created_at, action: e.action, actor: e.actor_user_id === null ? SYSTEM_ACTOR_NAME : e.actor_name, text }];
    })
    .reverse();
}
