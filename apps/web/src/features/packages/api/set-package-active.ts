import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, type ItemResponse } from '../../../lib/api-client';
import type { Package } from '@revloop/contract';
import { getPackagesQueryOptions } from './get-packages';

export const setPackageActive = ({ id, active }: { id: string; active: boolean }) =>
  api.patch<ItemResponse<Package>>(`/api/packages/${encodeURIComponent(id)}`, { active });

/** An inactive package stays on its jobs but is no longer offered at intake. */
export function useSetPackageActive() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: setPackageActive, onSuccess: () => queryClient.invalidateQueries({ queryKey: getPackagesQueryOptions().queryKey }) });
}
