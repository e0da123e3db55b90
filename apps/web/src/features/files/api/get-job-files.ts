import type { ReadPlausibility } from '@revloop/domain/calibration';
import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export type CalibrationModule = 'ECM' | 'TCM' | 'other';
export type CalibrationFileKind = 'read' | 'revision' | 're_read';
export type CalibrationFormat = 'raw' | 'intel_hex' | 'srec';

export interface AddressRange {
  start: number;
  end: number;
}

/** A calibration file as the API shows it (`fileRowToApi`). */
export interface CalibrationFile {
  id: string;
  jobId: string;
  module: CalibrationModule;
  kind: CalibrationFileKind;
  label: string;
  revisionNumber: number | null;
  forRound: number | null;
  parentFileId: string | null;
  notes: string;
  originalName: string;
  downloadName: string;
  format: CalibrationFormat;
  formatLabel: string;
  sha256: string;
  crc32: number;
  crc32Hex: string;
  sizeBytes: number;
  imageBytes: number;
  ranges: AddressRange[];
  uploadedBy: { id: string; name: string };
  createdAt: string;
  /** For reads, shown to shop staff: whether the image size is one the shop expects for the engine family. */
  plausibility?: ReadPlausibility | null;
}

/** What the signed-in user may do with this job's files. */
export interface JobFilesMeta {
  canUpload: boolean;
  canUploadRevision: boolean;
  canVerify: boolean;
}

export interface JobFilesResponse {
  data: CalibrationFile[];
  meta: JobFilesMeta;
}

/** Every files query sits under this key, so one invalidation refreshes lists, checks and diffs. */
export const filesRootKey = ['files'] as const;

export const getJobFiles = (jobId: string) => api.get<JobFilesResponse>(`/api/jobs/${encodeURIComponent(jobId)}/files`);

export const getJobFilesQueryOptions = (jobId: string) =>
  queryOptions({ queryKey: [...filesRootKey, 'job', jobId], queryFn: () => getJobFiles(jobId) });

export const useJobFiles = (jobId: string) => useQuery(getJobFilesQueryOptions(jobId));
