import { queryOptions, useQuery, type QueryClient } from '@tanstack/react-query';
import type { Me } from '@revloop/contract';
import { api } from '../../../lib/api-client';

/** The signed-in user, or null when signed out; the session probe answers 200 either way, so no error is logged. */
export async function getMe(): Promise<Me | null> {
  return (await api.get<{ data: Me | null }>('/api/me/session')).data;
}

export const getMeQueryOptions = () => queryOptions({ queryKey: ['me'], queryFn: getMe, staleTime: 60_000 });

export const useMe = () => useQuery(getMeQueryOptions());

/** The signed-in user, for screens inside the signed-in shell (which renders only once `/api/me` answered). */
export function useSignedInMe(): Me {
  const { data } = useMe();
  if (!data) throw new Error('useSignedInMe is only for screens inside the signed-in shell.');
  return data;
}

/**
 * Switches the cached session to `me` (null when signed out) and drops every other cached answer, so no
 * data of one user is shown to the next. The `me` entry itself is updated in place rather than removed,
 * so components already watching it (the ability, the shell) follow the change.
 */
export function replaceSession(queryClient: QueryClient, me: Me | null) {
  const meKey = getMeQueryOptions().queryKey;
  queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== meKey[0] });
  queryClient.setQueryData(meKey, me);
}
