import type { CalibrationFile, DownloadLockView } from '@revloop/contract';
import type { CalibrationFileKind, CalibrationFileListRow, CalibrationFileRow, JobListRow } from '@revloop/db';
import { formatCrc32, revisionDownloadName, type AddressRange, type CalibrationFormat } from '@revloop/domain/calibration';

export const FORMAT_LABELS: Record<CalibrationFormat, string> = { raw: 'Raw binary', intel_hex: 'Intel HEX', srec: 'Motorola S-record' };
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

/** A revision not sent yet: made for a round the job has not started (Send revision starts it). */
export const isDraft = (row: Pick<CalibrationFileRow, 'kind' | 'for_round'>, job: Pick<JobListRow, 'round'>): boolean =>
  row.kind === 'revision' && (row.for_round ?? 0) > job.round;

/**
 * `lock` is the file's paid-before-download lock for this viewer and `canApprove` the viewer's File `approve` ability on
 * this row, both computed by the caller that knows the viewer.
 */
export function fileRowToApi(row: CalibrationFileListRow, job: JobListRow, lock: DownloadLockView, canApprove = false): CalibrationFile {
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
    draft: isDraft(row, job),
    approvalRequired: row.approval_required === 1,
    approvedBy: row.approved_by_user_id ? { id: row.approved_by_user_id, name: row.approved_by_name ?? '' } : null,
    approvedAt: row.approved_at,
    sentAt: row.sent_at,
    sendNote: row.send_note,
    canApprove,
    lock: { locked: lock.locked, reason: lock.reason, dueMinor: lock.dueMinor, message: lock.message },
  };
}
export type ApiCalibrationFile = CalibrationFile;
