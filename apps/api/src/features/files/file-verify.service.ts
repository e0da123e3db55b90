import type { Verification } from '@revloop/contract';
import { findRevisionsWithImage, listJobFiles, type CalibrationFileRow, type JobListRow } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import { asSubject } from '@revloop/domain/auth';
import { diffImages, imagesEqual } from '@revloop/domain/calibration';
import type { AppDeps } from '../../context';
import type { AuthContext } from '../../http/auth-context';
import { imageOf } from './file-image';
import { fileLabel } from './file.presenter';
import { fileSubject, loadFile } from './file.service';

// What a check answers is the contract's shape (one authority for it).
export type { Verification } from '@revloop/contract';
type ForeignMatch = Verification['foreignMatches'][number];

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

/** The check behind GET /files/:id/verify: a file this viewer sees, checked only by those the File rules let verify. */
export async function verifyVisibleFile(deps: AppDeps, auth: AuthContext & { shop: { id: string } }, fileId: string): Promise<Verification> {
  const { row, job } = await loadFile(deps.db, auth, fileId);
  if (!auth.ability.can('verify', asSubject('File', fileSubject(row, job)))) throw new DomainError('forbidden', 'Only the shop checks files against its revisions.');
  return verifyFile(deps, auth, row, job);
}
