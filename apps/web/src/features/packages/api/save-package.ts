import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { PackageInput } from '@revloop/domain/jobs';
import { api, apiRequest, type ItemResponse } from '../../../lib/api-client';
import type { Package } from '@revloop/contract';
import { getPackagesQueryOptions } from './get-packages';

/** Creates a package, or replaces an existing one's fields when `id` is given. */
export const savePackage = ({ id, input }: { id?: string; input: PackageInput }) =>
  id
    ? apiRequest<ItemResponse<Package>>('PUT', `/api/packages/${encodeURIComponent(id)}`, input)
    : api.post<ItemResponse<Package>>('/api/packages', input);

export function useSavePackage() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: savePackage, onSuccess: () => queryClient.invalidateQueries({ queryKey: getPackagesQueryOptions().queryKey }) });
}
