import { findCalibrationFile, findJob, listJobFiles, type CalibrationFileRow, type Db, type JobListRow } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import { asSubject, type FileSubject } from '@revloop/domain/auth';
import type { AppDeps } from '../../context';
import { authorizeRow, type AuthContext } from '../../http/auth-context';
import { recordAudit } from '../audit/audit.service';
import { jobSubject, loadJob } from '../jobs/job.service';
import { readPlausibilityForJob } from '../vehicles/read-plausibility.service';
import { verifyFileLink } from './file-links';
import { downloadNameOf, fileLabel, fileRowToApi } from './file.presenter';

type ShopScoped = AuthContext & { shop: { id: string } };

/** A file as the File rules in the abilities see it: its job's scope, whether it reached the customer side, its uploader. */
export const fileSubject = (row: CalibrationFileRow, job: JobListRow): FileSubject => ({
  ...jobSubject(job),
  kind: row.kind,
  sent: row.kind !== 'revision' || (row.for_round ?? 0) <= job.round,
  uploadedByUserId: row.uploaded_by_user_id,
});

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
  return rows.filter((row) => canSeeFile(auth, row, job)).map((row) => ({ ...fileRowToApi(row, job), plausibility: revises ? plausibility(row) : null }));
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

/** An e-mailed link: the signature, not a session, grants this one file until it expires. */
export async function downloadFileByLink(deps: AppDeps, fileId: string, link: { shop: string; exp: number; sig: string }): Promise<FileDownload> {
  const { db, clock } = deps;
  verifyFileLink(deps.env.FILE_LINK_SECRET, { shopId: link.shop, fileId, exp: link.exp }, link.sig, clock.now());
  const row = await findCalibrationFile(db, link.shop, fileId);
  const job = row && (await findJob(db, link.shop, row.job_id));
  if (!row || !job) throw new DomainError('not_found', 'File not found.');
  await recordDownload(db, clock.now(), row, { userId: null, viaLink: true });
  return { row, name: downloadNameOf(row, job) };
}
