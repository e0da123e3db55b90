import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ItemResponse } from '../../../lib/api-client';
import type { DiffRange } from './get-file-verification';
import { filesRootKey, type CalibrationFile } from './get-job-files';

export interface FileDiffParams {
  gap: number;
  page: number;
  pageSize: number;
}

export interface FileDiff {
  a: CalibrationFile;
  b: CalibrationFile;
  gap: number;
  changedBytes: number;
  comparedBytes: number;
  changedShare: number;
  ranges: DiffRange[];
  page: number;
  pageSize: number;
  totalRanges: number;
  pageCount: number;
}

export const pairPath = (a: string, b: string) => `/api/files/${encodeURIComponent(a)}/diff/${encodeURIComponent(b)}`;

export const getFileDiff = (a: string, b: string, params: FileDiffParams) =>
  api.get<ItemResponse<FileDiff>>(`${pairPath(a, b)}?${new URLSearchParams({ gap: String(params.gap), page: String(params.page), pageSize: String(params.pageSize) })}`);

export const getFileDiffQueryOptions = (a: string, b: string, params: FileDiffParams) =>
  queryOptions({ queryKey: [...filesRootKey, 'diff', a, b, params], queryFn: () => getFileDiff(a, b, params), placeholderData: keepPreviousData });

export const useFileDiff = (a: string, b: string, params: FileDiffParams) => useQuery(getFileDiffQueryOptions(a, b, params));
