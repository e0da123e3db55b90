import { useMutation } from '@tanstack/react-query';
import { resetRequestSchema } from '@revloop/domain/auth';
import type { z } from 'zod';
import { api } from '../../../lib/api-client';

export { resetRequestSchema };
export type ResetRequestInput = z.output<typeof resetRequestSchema>;

/** The server answers 202 whether or not the address has an account, so the page says the same either way. */
export const requestPasswordReset = (input: ResetRequestInput) => api.post<void>('/api/auth/password-reset', input);

export const useRequestPasswordReset = () => useMutation({ mutationFn: requestPasswordReset });
