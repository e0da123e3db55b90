import { MutationCache, QueryCache, QueryClient } from '@tanstack/react-query';
import { isApiError } from './api-client';

/** A 4xx answer will not change on retry; only network and server errors are retried, twice. */
export function shouldRetry(failureCount: number, error: unknown): boolean {
  if (isApiError(error) && error.status >= 400 && error.status < 500) return false;
  return failureCount < 2;
}

/** `onUnauthenticated` runs when any request answers 401, e.g. after the session expired in another tab. */
export function createQueryClient({ onUnauthenticated }: { onUnauthenticated?: (client: QueryClient) => void } = {}): QueryClient {
  const on401 = (error: unknown) => {
    if (isApiError(error) && error.status === 401) onUnauthenticated?.(client);
  };
  const client: QueryClient = new QueryClient({
    queryCache: new QueryCache({ onError: on401 }),
    mutationCache: new MutationCache({ onError: on401 }),
    defaultOptions: {
      queries: { retry: shouldRetry, staleTime: 30_000, refetchOnWindowFocus: false },
      mutations: { retry: false },
    },
  });
  return client;
}
