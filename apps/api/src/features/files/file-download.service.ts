import { findCalibrationFile, findJob, findShopById, type CalibrationFileRow, type Db, type ShopRow } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import { asSubject, defineAbilityFor, type Actor } from '@revloop/domain/auth';
import { assertDownloadUnlocked } from '@revloop/domain/billing';
import type { JobListRow } from '@revloop/db';
import type { AppDeps } from '../../context';
import { authorizeRow, type AuthContext } from '../../http/auth-context';
import { recordAudit } from '../audit/audit.service';
import { downloadLocksFor } from '../billing/download-lock.service';
import { jobSubject } from '../jobs/job.service';
import { verifyFileLink } from './file-links';
import { downloadNameOf, fileLabel, isDraft } from './file.presenter';
import { fileLocksFor, fileSubject, loadFile } from './file.service';

// Downloads, signed in or through an e-mailed link: who may (the abilities), whether the file is locked until the
// job is paid (the domain's downloadLockFor), and the timeline entry.

type ShopScoped = AuthContext & { shop: ShopRow };

/** Records a download on the job's timeline; `viaLink` marks an e-mailed link used without a session. */
export async function recordDownload(db: Db, at: Date, row: CalibrationFileRow, actor: { userId: string | null; viaLink: boolean }) {
  await recordAudit(db, {
    shopId: row.shop_id,
    actorUserId: actor.userId,
    action: 'file.downloaded',
    subjectType: 'Job',
    subjectId: row.job_id,
    details: { fileId: row.id, viaLink: actor.viaLink, text: `${fileLabel(row)} downloaded${actor.viaLink ? ' through an e-mailed link' : ''}` },
    at,
  });
}

export interface FileDownload {
  row: CalibrationFileRow;
  name: string;
}

/** A file's bytes for this viewer (download, hex view): a 402 `payment_required` while it is locked until paid. */
export async function loadUnlockedFile(db: Db, auth: ShopScoped, fileId: string) {
  const { row, job } = await loadFile(db, auth, fileId);
  assertDownloadUnlocked((await fileLocksFor(db, auth, job))(row));
  return { row, job };
}

/** A signed-in download: a file this viewer sees on a job they may download from, unlocked, recorded on the timeline. */
export async function downloadFile(deps: AppDeps, auth: ShopScoped, fileId: string): Promise<FileDownload> {
  const { row, job } = await loadFile(deps.db, auth, fileId);
  authorizeRow(auth, 'download', 'Job', jobSubject(job));
  assertDownloadUnlocked((await fileLocksFor(deps.db, auth, job))(row));
  await recordDownload(deps.db, deps.clock.now(), row, { userId: auth.user.id, viaLink: false });
  return { row, name: downloadNameOf(row, job) };
}

/** Whom an e-mailed link stands for: the job's customer, so a link opens only what they may read (never a draft). */
const linkHolderOf = (job: JobListRow): Actor => ({
  userId: job.customer_user_id,
  platformAdmin: false,
  shopId: job.shop_id,
  role: 'customer',
  dealerId: null,
  shopReadOnly: false,
});

/** An e-mailed link: the signature, not a session, grants this one file until it expires — once the job is paid if it is locked. */
export async function downloadFileByLink(deps: AppDeps, fileId: string, link: { shop: string; exp: number; sig: string }): Promise<FileDownload> {
  const { db, clock } = deps;
  verifyFileLink(deps.env.FILE_LINK_SECRET, { shopId: link.shop, fileId, exp: link.exp }, link.sig, clock.now());
  const row = await findCalibrationFile(db, link.shop, fileId);
  const job = row && (await findJob(db, link.shop, row.job_id));
  const shop = job && (await findShopById(db, link.shop));
  if (!row || !job || !shop || !defineAbilityFor(linkHolderOf(job)).can('read', asSubject('File', fileSubject(row, job)))) {
    throw new DomainError('not_found', 'File not found.');
  }
  const lockOf = await downloadLocksFor(db, shop, job, { shopStaff: false });
  assertDownloadUnlocked(lockOf({ kind: row.kind, draft: isDraft(row, job) }));
  await recordDownload(db, clock.now(), row, { userId: null, viaLink: true });
  return { row, name: downloadNameOf(row, job) };
}
