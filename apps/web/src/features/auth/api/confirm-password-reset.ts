import { useMutation } from '@tanstack/react-query';
import { resetConfirmSchema } from '@revloop/domain/auth';
import type { z } from 'zod';
import { api } from '../../../lib/api-client';

export { resetConfirmSchema };
export type ResetConfirmInput = z.output<typeof resetConfirmSchema>;

export const confirmPasswordReset = (input: ResetConfirmInput) => api.post<void>('/api/auth/password-reset/confirm', input);

export const useConfirmPasswordReset = () => useMutation({ mutationFn: confirmPasswordReset });
