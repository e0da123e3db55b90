import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { FileDiff, FileDiffQuery } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { filesRootKey } from './get-job-files';

/** The diff's paging as the server reads it (the contract's query after its defaults). */
export type FileDiffParams = FileDiffQuery;

export const pairPath = (a: string, b: string) => `/api/files/${encodeURIComponent(a)}/diff/${encodeURIComponent(b)}`;

export const getFileDiff = (a: string, b: string, params: FileDiffParams) =>
  api.get<ItemResponse<FileDiff>>(`${pairPath(a, b)}?${new URLSearchParams({ gap: String(params.gap), page: String(params.page), pageSize: String(params.pageSize) })}`);

export const getFileDiffQueryOptions = (a: string, b: string, params: FileDiffParams) =>
  queryOptions({ queryKey: [...filesRootKey, 'diff', a, b, params], queryFn: () => getFileDiff(a, b, params), placeholderData: keepPreviousData });

export const useFileDiff = (a: string, b: string, params: FileDiffParams) => useQuery(getFileDiffQueryOptions(a, b, params));
