import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { getMailboxQueryOptions } from './get-mailbox';

export const clearMailbox = () => api.delete('/api/dev/mailbox');

export function useClearMailbox() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: clearMailbox,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getMailboxQueryOptions().queryKey }),
  });
}
