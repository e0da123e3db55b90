import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Kit, KitPatch } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { kitsRootKey } from './get-kits';

export const updateKit = ({ kitId, patch }: { kitId: string; patch: KitPatch }) => api.patch<ItemResponse<Kit>>(`/api/kits/${encodeURIComponent(kitId)}`, patch);

export function useUpdateKit() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: updateKit, onSettled: () => queryClient.invalidateQueries({ queryKey: kitsRootKey }) });
}
