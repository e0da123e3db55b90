import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';
import { replaceSession } from './get-me';

export const signOut = () => api.post<void>('/api/auth/sign-out');

/** Signing out drops every cached answer, so the next user sees nothing of the last one. */
export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signOut,
    onSuccess: () => replaceSession(queryClient, null),
  });
}
