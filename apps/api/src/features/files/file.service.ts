import { findCalibrationFile, findShopById, listJobFiles, type CalibrationFileListRow, type CalibrationFileRow, type Db, type JobListRow, type ShopRow } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import { asSubject, type FileSubject } from '@revloop/domain/auth';
import type { DownloadLock } from '@revloop/domain/billing';
import type { AppDeps } from '../../context';
import type { AuthContext } from '../../http/auth-context';
import { downloadLocksFor, isBench } from '../billing/download-lock.service';
import { jobSubject, loadJob } from '../jobs/job.service';
import { readPlausibilityForJob } from '../vehicles/read-plausibility.service';
import { fileLinkQuery } from './file-links';
import { fileLabel, fileRowToApi, isDraft } from './file.presenter';

type ShopScoped = AuthContext & { shop: ShopRow };

/** Each file's paid-before-download lock for this viewer (the domain's downloadLockFor decides; the job's money is read once). */
export async function fileLocksFor(db: Db, auth: ShopScoped, job: JobListRow): Promise<(row: CalibrationFileRow) => DownloadLock> {
  const lockOf = await downloadLocksFor(db, auth.shop, job, { shopStaff: isBench(auth.actor) });
  return (row) => lockOf({ kind: row.kind, draft: isDraft(row, job) });
}

/** A file as this viewer sees it in the API: its lock and whether they may approve it. */
export async function presentFile(db: Db, auth: ShopScoped, row: CalibrationFileListRow, job: JobListRow) {
  const lockOf = await fileLocksFor(db, auth, job);
  return fileRowToApi(row, job, lockOf(row), canApproveFile(auth, row, job));
}

/** A file as the File rules in the abilities see it: its job's scope, whether it reached the customer side, its uploader. */
export const fileSubject = (row: CalibrationFileRow, job: JobListRow): FileSubject => ({
  ...jobSubject(job),
  kind: row.kind,
  sent: !isDraft(row, job),
  uploadedByUserId: row.uploaded_by_user_id,
  approvalPending: row.approval_required === 1 && row.approved_by_user_id === null,
});

/** Whether this viewer may approve the draft now: the abilities' File rule (another tuner or the owner, never the uploader). */
export const canApproveFile = (auth: AuthContext, row: CalibrationFileRow, job: JobListRow): boolean =>
  auth.ability.can('approve', asSubject('File', fileSubject(row, job)));

/** Whether this viewer may see a file: the abilities' File rules decide (a revision reaches the customer side once sent). */
export const canSeeFile = (auth: AuthContext, row: CalibrationFileRow, job: JobListRow): boolean =>
  auth.ability.can('read', asSubject('File', fileSubject(row, job)));

/** A file this user may see, with its job; everything else (another shop, another job, hidden) is a 404. */
export async function loadFile(db: Db, auth: ShopScoped, fileId: string) {
  const row = await findCalibrationFile(db, auth.shop.id, fileId);
  if (!row) throw new DomainError('not_found', 'File not found.');
  const job = await loadJob(db, auth, row.job_id).catch(() => {
    throw new DomainError('not_found', 'File not found.');
  });
  if (!canSeeFile(auth, row, job)) throw new DomainError('not_found', 'File not found.');
  return { row, job };
}

/** One job's files filtered by the File rules: a job holds a handful of files, so the rule runs on each row. */
export async function listVisibleFiles(db: Db, auth: ShopScoped, job: JobListRow) {
  const rows = await listJobFiles(db, auth.shop.id, job.id);
  // A read whose size fits none the shop expects for the engine family is flagged to those who revise (a warning only).
  const plausibility = await readPlausibilityForJob(db, auth.shop, job);
  const revises = auth.ability.can('upload_revision', asSubject('Job', jobSubject(job)));
  const lockOf = await fileLocksFor(db, auth, job);
  return rows
    .filter((row) => canSeeFile(auth, row, job))
    .map((row) => ({ ...fileRowToApi(row, job, lockOf(row), canApproveFile(auth, row, job)), plausibility: revises ? plausibility(row) : null }));
}

/** What this viewer may do with the job's files, so the web shows only the forms that will work. */
export function fileAbilities(auth: AuthContext, job: JobListRow) {
  const subject = asSubject('Job', jobSubject(job));
  return {
    canUpload: auth.ability.can('upload', subject),
    canUploadRevision: auth.ability.can('upload_revision', subject),
    // Verify rules look at the job's scope only, so the job's fields answer for every file of it.
    canVerify: auth.ability.can('verify', asSubject('File', jobSubject(job))),
  };
}

/** The e-mail lines of Send revision: a signed download link for each draft of the coming round. */
export async function revisionLinkLines(deps: Pick<AppDeps, 'db' | 'clock' | 'env'>, job: JobListRow): Promise<string[]> {
  const { db, clock, env } = deps;
  const drafts = (await listJobFiles(db, job.shop_id, job.id)).filter((f) => f.kind === 'revision' && f.for_round === job.round + 1);
  // Paid before download: the customer hears before clicking that the links open once the job is paid.
  const shop = await findShopById(db, job.shop_id);
  const lock = shop && (await downloadLocksFor(db, shop, job, { shopStaff: false }))({ kind: 'revision', draft: false });
  return [
    ...(lock?.locked ? [`${lock.message} The links below work once the payment has landed.`, ''] : []),
    'Download (each link works for 7 days without signing in):',
    ...drafts.map((f) => `- ${fileLabel(f)}: ${env.APP_ORIGIN}/api/files/${f.id}/download?${fileLinkQuery(env.FILE_LINK_SECRET, job.shop_id, f.id, clock.now())}`),
  ];
}
