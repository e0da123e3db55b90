import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Kit, KitCreate } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { kitsRootKey } from './get-kits';

export const createKit = (input: KitCreate) => api.post<ItemResponse<Kit>>('/api/kits', input);

export function useCreateKit() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: createKit, onSettled: () => queryClient.invalidateQueries({ queryKey: kitsRootKey }) });
}
