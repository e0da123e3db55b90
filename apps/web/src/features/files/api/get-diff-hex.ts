import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ItemResponse } from '../../../lib/api-client';
import { pairPath } from './get-file-diff';
import { filesRootKey } from './get-job-files';

export interface HexRow {
  address: number;
  left: (number | null)[];
  right: (number | null)[];
  changed: boolean[];
  leftText: string;
  rightText: string;
}

export interface DiffHex {
  range: { start: number; end: number };
  width: number;
  rows: HexRow[];
  truncated: boolean;
}

export const getDiffHex = (a: string, b: string, range: { start: number; end: number }) =>
  api.get<ItemResponse<DiffHex>>(`${pairPath(a, b)}/hex?range=${range.start}-${range.end}`);

export const getDiffHexQueryOptions = (a: string, b: string, range: { start: number; end: number }) =>
  queryOptions({ queryKey: [...filesRootKey, 'diff', a, b, 'hex', range.start, range.end], queryFn: () => getDiffHex(a, b, range), placeholderData: keepPreviousData });

export const useDiffHex = (a: string, b: string, range: { start: number; end: number } | null) =>
  useQuery({ ...getDiffHexQueryOptions(a, b, range ?? { start: 0, end: 1 }), enabled: range !== null });
