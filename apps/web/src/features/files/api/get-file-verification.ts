import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Verification } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { filesRootKey } from './get-job-files';

export const getFileVerification = (fileId: string) => api.get<ItemResponse<Verification>>(`/api/files/${encodeURIComponent(fileId)}/verify`);

export const getFileVerificationQueryOptions = (fileId: string) =>
  queryOptions({ queryKey: [...filesRootKey, 'verify', fileId], queryFn: () => getFileVerification(fileId) });

export const useFileVerification = (fileId: string, enabled: boolean) => useQuery({ ...getFileVerificationQueryOptions(fileId), enabled });
