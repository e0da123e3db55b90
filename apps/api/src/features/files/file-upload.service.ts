import fsp from 'node:fs/promises';
import {
  countDraftsAwaitingApproval,
  findCalibrationFile,
  findPackage,
  insertCalibrationFile,
  isUniqueViolation,
  latestRead,
  latestRevision,
  modulesRevisedForRound,
  newId,
  updateJob,
  type CalibrationFileKind,
  type CalibrationFileRow,
  type CalibrationModule,
  type Db,
  type JobListRow,
} from '@revloop/db';
import { DomainError } from '@revloop/domain';
import { asSubject } from '@revloop/domain/auth';
import { parseCalibration, safeUploadName, type CalibrationFormat } from '@revloop/domain/calibration';
import { JOB_STATE_LABELS } from '@revloop/domain/jobs';
import type { AppDeps } from '../../context';
import type { AuthContext } from '../../http/auth-context';
import { writeWithAudit } from '../audit/audit.service';
import { jobSubject, loadJob, moveJob, setJobFacts } from '../jobs/job.service';
import { FORMAT_LABELS, fileLabel, type ApiCalibrationFile } from './file.presenter';
import { presentFile } from './file.service';
import { verifyFile, type Verification } from './file-verify.service';

type ShopAuth = AuthContext & { shop: { id: string; settings: string; name: string; revision_approval: number } };

export interface UploadInput {
  module: CalibrationModule;
  kind: CalibrationFileKind;
  notes: string;
}

/** Refuses what the upload may not do before anything is stored: role, job state. */
function assertMayUpload(auth: AuthContext, job: JobListRow, kind: CalibrationFileKind): void {
  const subject = asSubject('Job', jobSubject(job));
  const action = kind === 'revision' ? 'upload_revision' : 'upload';
  if (!auth.ability.can(action, subject)) {
    if (auth.actor.shopReadOnly) throw new DomainError('shop_read_only', 'This shop is read-only for now: you can read and download, but not upload.');
    throw new DomainError('forbidden', kind === 'revision' ? 'Only the shop’s tuners and owner upload revisions.' : 'Your role may not upload files to this job.');
  }
  if (job.state === 'cancelled') throw new DomainError('invalid_transition', 'This job is cancelled: files can no longer be added.');
  if (kind === 'revision' && job.state !== 'on_bench') {
    throw new DomainError(
      'invalid_transition',
      `Revisions are uploaded while the job is On the bench; this job is ${JOB_STATE_LABELS[job.state]}. Move it to the bench first.`,
    );
  }
}

/** Where a revision sits in its module's history: the next number, and the file it was made from. */
async function revisionPlace(db: Db, shopId: string, jobId: string, module: CalibrationModule) {
  const previous = await latestRevision(db, shopId, jobId, module);
  const parent = previous ?? (await latestRead(db, shopId, jobId, module));
  return { number: (previous?.revision_number ?? 0) + 1, parentId: parent?.id ?? null };
}

export interface UploadResult {
  file: ApiCalibrationFile;
  /** Modules of the package still waiting for a revision draft before the job can be sent (revisions only). */
  waitingFor: CalibrationModule[];
  movedTo: string | null;
  verification: Verification | null;
}

/**
 * The upload pipeline after multer has streamed the body to `tempFile`: check the name, role and state, parse the
 * file into a memory image (bad input is refused with its reason), then move it into the blob store, then write the
 * row. Any refusal removes the temporary file, so a failed upload leaves nothing behind.
 */
export async function storeUpload(
  deps: AppDeps,
  auth: ShopAuth,
  jobId: string,
  upload: { tempFile: string; originalName: string },
  input: UploadInput,
): Promise<UploadResult> {
  const { db, blobs, clock } = deps;
  let stored = false;
  try {
    const job = await loadJob(db, auth, jobId);
    assertMayUpload(auth, job, input.kind);
    const originalName = safeUploadName(upload.originalName);
    const parsed = parseCalibration(new Uint8Array(await fsp.readFile(upload.tempFile)), originalName);
    const place = input.kind === 'revision' ? await revisionPlace(db, auth.shop.id, job.id, input.module) : null;
    const blob = await blobs.adopt(upload.tempFile);
    stored = true;
    const at = clock.now();
    const values = {
      id: newId(),
      shop_id: auth.shop.id,
      job_id: job.id,
      module: input.module,
      kind: input.kind,
      revision_number: place?.number ?? null,
      for_round: place ? job.round + 1 : null,
      parent_file_id: place?.parentId ?? null,
      notes: input.notes,
      original_name: originalName,
      format: parsed.format,
      sha256: blob.sha256,
      crc32: parsed.crc32,
      size_bytes: blob.size,
      image_bytes: parsed.sizeBytes,
      ranges: JSON.stringify(parsed.ranges),
      uploaded_by_user_id: auth.user.id,
      created_at: at.toISOString(),
      // The shop's setting when the draft is made decides whether it needs a second person's approval.
      approval_required: input.kind === 'revision' && auth.shop.revision_approval === 1 ? 1 : 0,
    };
    // Compared before the row is written (it reads stored files, so it stays outside the transaction); a re-read is
    // compared only with the job's reads and revisions, so the missing row changes nothing.
    const pending: CalibrationFileRow = { ...values, approved_by_user_id: null, approved_at: null, sent_at: null, send_note: null };
    const verification = input.kind === 'revision' ? null : await verifyFile(deps, auth, pending, job);
    const row = await writeWithAudit(
      db,
      (trx) =>
        insertCalibrationFile(trx, values).catch((error: unknown) => {
          if (isUniqueViolation(error)) throw new DomainError('conflict', `Revision ${place?.number} of the ${input.module} was just uploaded by someone else. Reload and try again.`);
          throw error;
        }),
      (inserted) => ({
        shopId: auth.shop.id,
        actorUserId: auth.user.id,
        action: 'file.uploaded',
        subjectType: 'Job',
        subjectId: job.id,
        details: { fileId: inserted.id, text: uploadTimelineText(inserted, parsed.format, verification) },
        at,
      }),
    );
    const listRow = (await findCalibrationFile(db, auth.shop.id, row.id))!;
    const flow = await followJobFlow(deps, auth, job, row);
    return { file: await presentFile(db, auth, listRow, job), verification, ...flow };
  } catch (error) {
    if (!stored) await blobs.discard(upload.tempFile);
    throw error;
  }
}

function uploadTimelineText(row: CalibrationFileRow, format: CalibrationFormat, verification: Verification | null): string {
  const base = `${row.kind === 'revision' ? `Revision ${row.revision_number} (${row.module})` : fileLabel(row)} uploaded, ${FORMAT_LABELS[format]}`;
  const notes = [verification?.kind === 're_read' ? verification.message : null, verification?.foreignMatch ? verification.foreignMessage : null].filter(Boolean);
  return notes.length ? `${base}: ${notes.join('; ')}` : base;
}

/**
 * What follows from a file: the first read makes an intake job ready; a revision is a draft the shop sends later, so
 * it only records whether every module the package covers has its draft for the coming round and how many drafts
 * still wait for the approval the shop asks for (the board and the send guard read both).
 */
async function followJobFlow(deps: AppDeps, auth: ShopAuth, job: JobListRow, row: CalibrationFileRow): Promise<{ waitingFor: CalibrationModule[]; movedTo: string | null }> {
  const { db, clock } = deps;
  if (row.kind === 'read' && job.has_stock_read === 0) {
    await setJobFacts(db, auth.shop.id, job.id, { hasStockRead: true }, clock.now());
    if (job.state === 'intake') {
      await moveJob(deps, auth, job.id, 'ready', { bySystem: true });
      return { waitingFor: [], movedTo: 'ready' };
    }
  }
  if (row.kind !== 'revision') return { waitingFor: [], movedTo: null };
  const round = job.round + 1;
  const pkg = await findPackage(db, auth.shop.id, job.package_id);
  const covered = pkg ? (JSON.parse(pkg.modules) as CalibrationModule[]) : [row.module];
  const revised = await modulesRevisedForRound(db, auth.shop.id, job.id, round);
  const waitingFor = covered.filter((module) => !revised.includes(module));
  const waiting = await countDraftsAwaitingApproval(db, auth.shop.id, job.id, round);
  await updateJob(db, auth.shop.id, job.id, { drafts_awaiting_approval: waiting, updated_at: clock.now().toISOString() });
  if (waitingFor.length === 0) await setJobFacts(db, auth.shop.id, job.id, { hasRevisionForRound: true }, clock.now());
  return { waitingFor, movedTo: null };
}
