import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { DiffHex } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { pairPath } from './get-file-diff';
import { filesRootKey } from './get-job-files';

export const getDiffHex = (a: string, b: string, range: { start: number; end: number }) =>
  api.get<ItemResponse<DiffHex>>(`${pairPath(a, b)}/hex?range=${range.start}-${range.end}`);

export const getDiffHexQueryOptions = (a: string, b: string, range: { start: number; end: number }) =>
  queryOptions({ queryKey: [...filesRootKey, 'diff', a, b, 'hex', range.start, range.end], queryFn: () => getDiffHex(a, b, range), placeholderData: keepPreviousData });

export const useDiffHex = (a: string, b: string, range: { start: number; end: number } | null) =>
  useQuery({ ...getDiffHexQueryOptions(a, b, range ?? { start: 0, end: 1 }), enabled: range !== null });
