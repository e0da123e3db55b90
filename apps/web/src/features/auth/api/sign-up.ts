import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Me } from '@revloop/contract';
import { signUpSchema } from '@revloop/domain/auth';
import type { z } from 'zod';
import { api } from '../../../lib/api-client';
import { replaceSession } from './get-me';

export { signUpSchema };
export type SignUpInput = z.output<typeof signUpSchema>;

/** Creates a shop and its owner, and signs the owner in. */
export const signUp = (input: SignUpInput) => api.post<Me>('/api/auth/sign-up', input);

export function useSignUp() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: signUp,
    onSuccess: (me) => replaceSession(queryClient, me),
  });
}
