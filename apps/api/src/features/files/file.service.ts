import { findCalibrationFile, findJob, listJobFiles, type CalibrationFileRow, type Db, type JobListRow } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import { asSubject, defineAbilityFor, type Actor, type FileSubject } from '@revloop/domain/auth';
import type { AppDeps } from '../../context';
import { authorizeRow, type AuthContext } from '../../http/auth-context';
import { recordAudit } from '../audit/audit.service';
import { jobSubject, loadJob } from '../jobs/job.service';
import { readPlausibilityForJob } from '../vehicles/read-plausibility.service';
import { fileLinkQuery, verifyFileLink } from './file-links';
import { downloadNameOf, fileLabel, fileRowToApi, isDraft } from './file.presenter';

type ShopScoped = AuthContext & { shop: { id: string } };

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
  return rows
    .filter((row) => canSeeFile(auth, row, job))
    .map((row) => ({ ...fileRowToApi(row, job, canApproveFile(auth, row, job)), plausibility: revises ? plausibility(row) : null }));
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
  return [
    'Download (each link works for 7 days without signing in):',
    ...drafts.map((f) => `- ${fileLabel(f)}: ${env.APP_ORIGIN}/api/files/${f.id}/download?${fileLinkQuery(env.FILE_LINK_SECRET, job.shop_id, f.id, clock.now())}`),
  ];
}

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

/** A signed-in download: a file this viewer sees on a job they may download from, recorded on the timeline. */
export async function downloadFile(deps: AppDeps, auth: ShopScoped, fileId: string): Promise<FileDownload> {
  const { row, job } = await loadFile(deps.db, auth, fileId);
  authorizeRow(auth, 'download', 'Job', jobSubject(job));
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

/** An e-mailed link: the signature, not a session, grants this one file until it expires. */
export async function downloadFileByLink(deps: AppDeps, fileId: string, link: { shop: string; exp: number; sig: string }): Promise<FileDownload> {
  const { db, clock } = deps;
  verifyFileLink(deps.env.FILE_LINK_SECRET, { shopId: link.shop, fileId, exp: link.exp }, link.sig, clock.now());
  const row = await findCalibrationFile(db, link.shop, fileId);
  const job = row && (await findJob(db, link.shop, row.job_id));
  if (!row || !job || !defineAbilityFor(linkHolderOf(job)).can('read', asSubject('File', fileSubject(row, job)))) {
    throw new DomainError('not_found', 'File not found.');
  }
  await recordDownload(db, clock.now(), row, { userId: null, viaLink: true });
  return { row, name: downloadNameOf(row, job) };
}
