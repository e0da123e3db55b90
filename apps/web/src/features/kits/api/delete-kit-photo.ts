import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { kitsRootKey } from './get-kits';

export const deleteKitPhoto = ({ kitId, photoId }: { kitId: string; photoId: string }) => api.delete(`/api/kits/${encodeURIComponent(kitId)}/photos/${encodeURIComponent(photoId)}`);

export function useDeleteKitPhoto() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: deleteKitPhoto, onSettled: () => queryClient.invalidateQueries({ queryKey: kitsRootKey }) });
}
