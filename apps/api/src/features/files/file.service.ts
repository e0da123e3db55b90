import fsp from 'node:fs/promises';
import {
  findCalibrationFile,
  findPackage,
  findRevisionsWithImage,
  insertCalibrationFile,
  latestRead,
  latestRevision,
  listJobFiles,
  modulesRevisedForRound,
  newId,
  type CalibrationFileKind,
  type CalibrationFileListRow,
  type CalibrationFileRow,
  type CalibrationModule,
  type Db,
  type JobListRow,
} from '@revloop/db';
import { DomainError } from '@revloop/domain';
import { asSubject } from '@revloop/domain/auth';
import {
  diffImages,
  formatCrc32,
  imagesEqual,
  parseCalibration,
  revisionDownloadName,
  safeUploadName,
  type AddressRange,
  type CalibrationFormat,
  type DiffRange,
  type MemoryImage,
} from '@revloop/domain/calibration';
import { JOB_STATE_LABELS } from '@revloop/domain/jobs';
import type { AppDeps } from '../../context';
import type { AuthContext } from '../../http/auth-context';
import { recordAudit } from '../audit/audit.service';
import { jobSubject, loadJob, moveJob, setJobFacts } from '../jobs/job.service';
import { fileLinkQuery } from './file-links';
import { readPlausibilityForJob } from '../vehicles/read-plausibility.service';

type ShopAuth = AuthContext & { shop: { id: string; settings: string; name: string } };

export const MODULES = ['ECM', 'TCM', 'other'] as const satisfies readonly CalibrationModule[];
export const KINDS = ['read', 'revision', 're_read'] as const satisfies readonly CalibrationFileKind[];

const FORMAT_LABELS: Record<CalibrationFormat, string> = { raw: 'Raw binary', intel_hex: 'Intel HEX', srec: 'Motorola S-record' };
const KIND_LABELS: Record<CalibrationFileKind, string> = { read: 'Read', revision: 'Revision', re_read: 'Re-read' };
const SREC_EXTENSIONS = ['s19', 's28', 's37', 'srec', 'mot'];

/** "Rev 2 (ECM)", "Read (TCM)": how people name a file on the phone and in the timeline. */
export function fileLabel(row: Pick<CalibrationFileRow, 'kind' | 'module' | 'revision_number'>): string {
  return row.kind === 'revision' ? `Rev ${row.revision_number} (${row.module})` : `${KIND_LABELS[row.kind]} (${row.module})`;
}

function extensionFor(row: Pick<CalibrationFileRow, 'format' | 'original_name'>): string {
  if (row.format === 'intel_hex') return 'hex';
  if (row.format === 'raw') return 'bin';
  const own = row.original_name.split('.').pop()?.toLowerCase() ?? '';
  return SREC_EXTENSIONS.includes(own) ? own : 'srec';
}

/** Revisions are named for the customer's records; reads keep the name they were uploaded under. */
export function downloadNameOf(row: CalibrationFileRow, job: JobListRow): string {
  if (row.kind !== 'revision' || row.revision_number === null) return row.original_name;
  return revisionDownloadName({
    customerSurname: job.customer_name.trim().split(/\s+/).at(-1) ?? '',
    vehicleShort: `${job.vehicle_model_year} ${job.vehicle_description.split(',')[0] ?? ''}`,
    module: row.module,
    revision: row.revision_number,
    ext: extensionFor(row),
  });
}

export function fileRowToApi(row: CalibrationFileListRow, job: JobListRow) {
  return {
    id: row.id,
    jobId: row.job_id,
    module: row.module,
    kind: row.kind,
    label: fileLabel(row),
    revisionNumber: row.revision_number,
    forRound: row.for_round,
    parentFileId: row.parent_file_id,
    notes: row.notes,
    originalName: row.original_name,
    downloadName: downloadNameOf(row, job),
    format: row.format,
    formatLabel: FORMAT_LABELS[row.format],
    sha256: row.sha256,
    crc32: row.crc32,
    crc32Hex: formatCrc32(row.crc32),
    sizeBytes: row.size_bytes,
    imageBytes: row.image_bytes,
    ranges: JSON.parse(row.ranges) as AddressRange[],
    uploadedBy: { id: row.uploaded_by_user_id, name: row.uploaded_by_name },
    createdAt: row.created_at,
  };
}
export type ApiCalibrationFile = ReturnType<typeof fileRowToApi>;

const isShopSide = (auth: AuthContext) => auth.actor.role === 'owner' || auth.actor.role === 'tuner';

/**
 * Whether this viewer may see a file of a job they can already see. The customer side sees revisions once sent
 * (their round has started) and the customer their own uploads; the dealer sees everything on its customers' jobs
 * except revisions not sent yet.
 */
export function canSeeFile(auth: AuthContext, row: CalibrationFileRow, job: JobListRow): boolean {
  if (isShopSide(auth)) return true;
  const sent = row.kind !== 'revision' || (row.for_round ?? 0) <= job.round;
  if (!sent) return false;
  if (auth.actor.role === 'dealer') return true;
  return row.kind === 'revision' || row.uploaded_by_user_id === auth.user.id;
}

/** A file this user may see, with its job; everything else (another shop, another job, hidden) is a 404. */
export async function loadFile(db: Db, auth: AuthContext & { shop: { id: string } }, fileId: string) {
  const row = await findCalibrationFile(db, auth.shop.id, fileId);
  if (!row) throw new DomainError('not_found', 'File not found.');
  const job = await loadJob(db, auth, row.job_id).catch(() => {
    throw new DomainError('not_found', 'File not found.');
  });
  if (!canSeeFile(auth, row, job)) throw new DomainError('not_found', 'File not found.');
  return { row, job };
}

export async function listVisibleFiles(db: Db, auth: AuthContext & { shop: { id: string; settings: string } }, job: JobListRow) {
  const rows = await listJobFiles(db, auth.shop.id, job.id);
  // A read whose size fits none the shop expects for the engine family is flagged to shop staff (a warning only).
  const plausibility = await readPlausibilityForJob(db, auth.shop, job);
  return rows.filter((row) => canSeeFile(auth, row, job)).map((row) => ({ ...fileRowToApi(row, job), plausibility: isShopSide(auth) ? plausibility(row) : null }));
}

/** What this viewer may do with the job's files, so the web shows only the forms that will work. */
export function fileAbilities(auth: AuthContext, job: JobListRow) {
  const subject = asSubject('Job', jobSubject(job));
  return {
    canUpload: auth.ability.can('upload', subject),
    canUploadRevision: auth.ability.can('upload_revision', subject),
    canVerify: isShopSide(auth),
  };
}

// Parsed images by content hash: blobs never change, and a diff's hex pages re-read the same two files.
const IMAGE_CACHE_SIZE = 8;
const imageCache = new Map<string, MemoryImage>();

export async function imageOf(deps: Pick<AppDeps, 'blobs'>, row: Pick<CalibrationFileRow, 'sha256' | 'original_name'>): Promise<MemoryImage> {
  const cached = imageCache.get(row.sha256);
  if (cached) return cached;
  const image = parseCalibration(await deps.blobs.read(row.sha256), row.original_name).image;
  imageCache.set(row.sha256, image);
  if (imageCache.size > IMAGE_CACHE_SIZE) imageCache.delete(imageCache.keys().next().value!);
  return image;
}

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
  /** Modules of the package still waiting for a revision before the job is sent (revisions only). */
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
    const row = await insertCalibrationFile(db, {
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
    }).catch((error: unknown) => {
      if (String(error).includes('UNIQUE')) throw new DomainError('conflict', `Revision ${place?.number} of the ${input.module} was just uploaded by someone else. Reload and try again.`);
      throw error;
    });
    const listRow = (await findCalibrationFile(db, auth.shop.id, row.id))!;
    const verification = input.kind === 'revision' ? null : await verifyFile(deps, auth, listRow, job);
    await recordAudit(db, {
      shopId: auth.shop.id,
      actorUserId: auth.user.id,
      action: 'file.uploaded',
      subjectType: 'Job',
      subjectId: job.id,
      details: { fileId: row.id, text: uploadTimelineText(row, parsed.format, verification) },
      at,
    });
    const flow = await followJobFlow(deps, auth, job, row);
    return { file: fileRowToApi(listRow, job), verification, ...flow };
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
 * The job moves that follow from a file: the first read makes an intake job ready; a revision sends the job to the
 * customer once every module the package covers has its revision for the coming round.
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
  if (waitingFor.length > 0) return { waitingFor, movedTo: null };
  await setJobFacts(db, auth.shop.id, job.id, { hasRevisionForRound: true }, clock.now());
  const files = (await listJobFiles(db, auth.shop.id, job.id)).filter((f) => f.kind === 'revision' && f.for_round === round);
  const lines = [
    'Download (each link works for 7 days without signing in):',
    ...files.map((f) => `- ${fileLabel(f)}: ${deps.env.APP_ORIGIN}/api/files/${f.id}/download?${fileLinkQuery(deps.env.FILE_LINK_SECRET, auth.shop.id, f.id, clock.now())}`),
  ];
  await moveJob(deps, auth, job.id, 'with_customer', { bySystem: true, extraEmailLines: lines });
  return { waitingFor: [], movedTo: 'with_customer' };
}

export interface ForeignMatch {
  fileId: string;
  jobId: string;
  jobNumber: number;
  module: CalibrationModule;
  revisionNumber: number | null;
}

export interface Verification {
  fileId: string;
  kind: CalibrationFileKind;
  module: CalibrationModule;
  /**
   * matches: equals the revision believed on the car (or, before any revision, the read);
   * matches_older: equals an older revision of the job; differs: equals none, compared with the believed one;
   * no_reference: nothing to compare with; not_compared: reads and revisions are only checked for foreign matches.
   */
  status: 'matches' | 'matches_older' | 'differs' | 'no_reference' | 'not_compared';
  matchesRevision: number | null;
  /** The file the shop believes is on the car (latest revision sent for the module, else the read). */
  believed: { fileId: string; label: string; revisionNumber: number | null } | null;
  changedBytes: number;
  changedShare: number;
  ranges: DiffRange[];
  totalRanges: number;
  warning: boolean;
  message: string;
  foreignMatch: boolean;
  foreignMatches: ForeignMatch[];
  foreignMessage: string | null;
}

const MAX_VERIFY_RANGES = 50;

/**
 * Proof of what is on the car. A re-read is compared with the job's revisions of its module: an exact match names the
 * revision; otherwise it is diffed against the one the shop believes is on the car. Any read whose image (CRC-32 and
 * size) matches a revision of another job in the shop is flagged.
 */
export async function verifyFile(deps: AppDeps, auth: { shop: { id: string } }, row: CalibrationFileRow, job: JobListRow): Promise<Verification> {
  const { db } = deps;
  const base = { fileId: row.id, kind: row.kind, module: row.module };
  const foreignMatches: ForeignMatch[] =
    row.kind === 'revision'
      ? []
      : (await findRevisionsWithImage(db, auth.shop.id, { crc32: row.crc32, imageBytes: row.image_bytes }, job.id)).map((m) => ({
          fileId: m.id,
          jobId: m.job_id,
          jobNumber: m.job_number,
          module: m.module,
          revisionNumber: m.revision_number,
        }));
  const foreign = {
    foreignMatch: foreignMatches.length > 0,
    foreignMatches,
    foreignMessage: foreignMatches.length
      ? `This image is identical to ${foreignMatches.map((m) => `Rev ${m.revisionNumber} (${m.module}) of job ${m.jobNumber}`).join(', ')}: it is not a stock read, or a file moved between cars.`
      : null,
  };
  const none = { matchesRevision: null, believed: null, changedBytes: 0, changedShare: 0, ranges: [], totalRanges: 0 };
  if (row.kind !== 're_read') {
    return { ...base, ...none, ...foreign, status: 'not_compared', warning: foreign.foreignMatch, message: foreign.foreignMessage ?? 'Only re-reads are compared with revisions.' };
  }
  const files = await listJobFiles(db, auth.shop.id, job.id);
  const revisions = files.filter((f) => f.kind === 'revision' && f.module === row.module && (f.for_round ?? 0) <= job.round);
  const believed = revisions.at(-1) ?? files.find((f) => f.kind === 'read' && f.module === row.module);
  if (!believed) {
    return { ...base, ...none, ...foreign, status: 'no_reference', warning: foreign.foreignMatch, message: `No revision or read of the ${row.module} to compare with yet.` };
  }
  const image = await imageOf(deps, row);
  const candidates = [believed, ...revisions.filter((f) => f.id !== believed.id).reverse()];
  for (const candidate of candidates) {
    if (candidate.crc32 !== row.crc32 || candidate.image_bytes !== row.image_bytes) continue;
    if (!imagesEqual(image, await imageOf(deps, candidate))) continue;
    const believedRef = { fileId: believed.id, label: fileLabel(believed), revisionNumber: believed.revision_number };
    if (candidate.id === believed.id) {
      const message = believed.kind === 'revision' ? `Matches revision ${believed.revision_number}.` : 'Matches the read: no revision has been flashed yet.';
      return { ...base, ...none, ...foreign, believed: believedRef, status: 'matches', matchesRevision: believed.revision_number, warning: foreign.foreignMatch, message };
    }
    return {
      ...base,
      ...none,
      ...foreign,
      believed: believedRef,
      status: 'matches_older',
      matchesRevision: candidate.revision_number,
      warning: true,
      message: `Matches revision ${candidate.revision_number}, not revision ${believed.revision_number} that was sent last: the latest revision is not on the car.`,
    };
  }
  const diff = diffImages(await imageOf(deps, believed), image);
  const count = diff.ranges.length;
  return {
    ...base,
    ...foreign,
    status: 'differs',
    matchesRevision: null,
    believed: { fileId: believed.id, label: fileLabel(believed), revisionNumber: believed.revision_number },
    changedBytes: diff.changedBytes,
    changedShare: diff.changedShare,
    ranges: diff.ranges.slice(0, MAX_VERIFY_RANGES),
    totalRanges: count,
    warning: true,
    message: `Differs from ${believed.kind === 'revision' ? `revision ${believed.revision_number}` : 'the read'} in ${count} range${count === 1 ? '' : 's'} (${diff.changedBytes} bytes): the file on the car was changed outside the shop.`,
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
