import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { KitPhoto } from '@revloop/contract';
import type { ItemResponse } from '../../../lib/api-client';
import { uploadWithProgress } from '../../../lib/upload-with-progress';
import { kitsRootKey } from './get-kits';

export const addKitPhoto = ({ kitId, file }: { kitId: string; file: File }) => uploadWithProgress<ItemResponse<KitPhoto>>(`/api/kits/${encodeURIComponent(kitId)}/photos`, file);

export function useAddKitPhoto() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: addKitPhoto, onSettled: () => queryClient.invalidateQueries({ queryKey: kitsRootKey }) });
}
