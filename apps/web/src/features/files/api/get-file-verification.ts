import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ItemResponse } from '../../../lib/api-client';
import { filesRootKey, type CalibrationFileKind, type CalibrationModule } from './get-job-files';

export interface DiffRange {
  start: number;
  end: number;
  changedBytes: number;
}

/** The proof check of one file (`GET /api/files/:id/verify`). */
export interface Verification {
  fileId: string;
  kind: CalibrationFileKind;
  module: CalibrationModule;
  status: 'matches' | 'matches_older' | 'differs' | 'no_reference' | 'not_compared';
  matchesRevision: number | null;
  believed: { fileId: string; label: string; revisionNumber: number | null } | null;
  changedBytes: number;
  changedShare: number;
  ranges: DiffRange[];
  totalRanges: number;
  warning: boolean;
  message: string;
  foreignMatch: boolean;
  foreignMatches: Array<{ fileId: string; jobId: string; jobNumber: number; module: CalibrationModule; revisionNumber: number | null }>;
  foreignMessage: string | null;
}

export const getFileVerification = (fileId: string) => api.get<ItemResponse<Verification>>(`/api/files/${encodeURIComponent(fileId)}/verify`);

export const getFileVerificationQueryOptions = (fileId: string) =>
  queryOptions({ queryKey: [...filesRootKey, 'verify', fileId], queryFn: () => getFileVerification(fileId) });

export const useFileVerification = (fileId: string, enabled: boolean) => useQuery({ ...getFileVerificationQueryOptions(fileId), enabled });
