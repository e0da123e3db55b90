import { useMutation } from '@tanstack/react-query';
import type { PublicStartInput } from '@revloop/contract';
import { api } from '../../../lib/api-client';

/** `POST /api/public/shops/:slug/start`: keeps the sign-up and intake and mails the confirmation link. */
export const startTune = (slug: string, input: PublicStartInput) =>
  api.post<void>(`/api/public/shops/${encodeURIComponent(slug)}/start`, input);

export const useStartTune = (slug: string) =>
  useMutation({ mutationFn: (input: PublicStartInput) => startTune(slug, input) });
