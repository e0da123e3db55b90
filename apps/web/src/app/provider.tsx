import { useMemo, useState, type ReactNode } from 'react';
import { QueryClientProvider } from '@tanstack/react-query';
import { AbilityProvider } from '@casl/react';
import { defineAbilityFor } from '@revloop/domain/auth';
import { getMeQueryOptions, useMe } from '../features/auth/api/get-me';
import { createQueryClient } from '../lib/query-client';

/** The ability follows `/api/me`: it is rebuilt whenever the signed-in actor changes. */
function MeAbilityProvider({ children }: { children: ReactNode }) {
  const me = useMe();
  const actor = me.data?.actor ?? null;
  const ability = useMemo(() => defineAbilityFor(actor), [actor]);
  return <AbilityProvider value={ability}>{children}</AbilityProvider>;
}

// A 401 anywhere means the session ended: re-ask `/api/me`, whose null answer sends the user to sign in.
const newQueryClient = () =>
  createQueryClient({ onUnauthenticated: (client) => void client.invalidateQueries({ queryKey: getMeQueryOptions().queryKey }) });

export function AppProvider({ children }: { children: ReactNode }) {
  const [queryClient] = useState(newQueryClient);
  return (
    <QueryClientProvider client={queryClient}>
      <MeAbilityProvider>{children}</MeAbilityProvider>
    </QueryClientProvider>
  );
}
