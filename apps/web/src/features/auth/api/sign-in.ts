import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Me } from '@revloop/contract';
import { signInSchema } from '@revloop/domain/auth';
import type { z } from 'zod';
import { api } from '../../../lib/api-client';
import { replaceSession } from './get-me';

export { signInSchema };
export type SignInInput = z.output<typeof signInSchema>;

export const signIn = (input: SignInInput) => api.post<Me>('/api/auth/sign-in', input);

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signIn,
    onSuccess: (me) => replaceSession(queryClient, me),
  });
}
