import { approveRevisionDraft, countDraftsAwaitingApproval, findCalibrationFile, findJob, inTransaction, updateJob, type ShopRow } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import type { CalibrationFile } from '@revloop/contract';
import type { AppDeps } from '../../context';
import type { AuthContext } from '../../http/auth-context';
import { recordAudit } from '../audit/audit.service';
import { loadJob } from '../jobs/job.service';
import { fileLabel } from './file.presenter';
import { canApproveFile, loadFile, presentFile } from './file.service';

type ShopScoped = AuthContext & { shop: ShopRow };

/**
 * A second person approves a revision draft: the abilities decide who (another tuner or the owner, never the
 * uploader). In one transaction: the approval, the job's count of drafts still waiting (the board and the send guard
 * read it) and the audit event the staff timeline shows.
 */
export async function approveDraft(deps: AppDeps, auth: ShopScoped, fileId: string): Promise<{ file: CalibrationFile; jobInReach: boolean }> {
  const { db, clock } = deps;
  const file = await inTransaction(db, async (trx) => {
    const { row, job } = await loadFile(trx, auth, fileId);
    if (!canApproveFile(auth, row, job)) {
      if (auth.actor.shopReadOnly) throw new DomainError('shop_read_only', 'This shop is read-only for now: drafts cannot be approved.');
      if (row.uploaded_by_user_id === auth.user.id) throw new DomainError('forbidden', 'You uploaded this draft: another tuner or the owner approves it.');
      if (row.approved_by_user_id !== null) throw new DomainError('conflict', `${fileLabel(row)} is already approved.`);
      throw new DomainError('forbidden', 'Only a draft waiting for approval can be approved, by another tuner or the owner.');
    }
    const at = clock.now();
    if (!(await approveRevisionDraft(trx, auth.shop.id, row.id, auth.user.id, at.toISOString()))) {
      throw new DomainError('conflict', `${fileLabel(row)} was just approved by someone else.`);
    }
    const waiting = await countDraftsAwaitingApproval(trx, auth.shop.id, job.id, job.round + 1);
    await updateJob(trx, auth.shop.id, job.id, { drafts_awaiting_approval: waiting, updated_at: at.toISOString() });
    await recordAudit(trx, {
      shopId: auth.shop.id,
      actorUserId: auth.user.id,
      action: 'revision.approved',
      subjectType: 'Job',
      subjectId: job.id,
      details: { fileId: row.id, text: `${fileLabel(row)} approved` },
      at,
    });
    const fresh = (await findCalibrationFile(trx, auth.shop.id, row.id))!;
    return presentFile(trx, auth, fresh, (await findJob(trx, auth.shop.id, job.id))!);
  });
  // A tuner who reviewed a job outside their own reach loses it once nothing waits for approval; the web moves on.
  const jobInReach = await loadJob(db, auth, file.jobId).then(
    () => true,
    () => false,
  );
  return { file, jobInReach };
}
