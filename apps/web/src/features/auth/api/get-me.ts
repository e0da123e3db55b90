import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Actor, ShopRole } from '@revloop/domain/auth';
import { api, isApiError } from '../../../lib/api-client';

export type UnitSystem = 'metric' | 'imperial';

export interface Me {
  user: { id: string; email: string; name: string; unitSystem: UnitSystem };
  role: ShopRole | 'platform_admin' | null;
  platformAdmin: boolean;
  shop: { id: string; name: string; status: 'active' | 'suspended'; readOnly: boolean; currency: string } | null;
  dealer: { id: string; name: string } | null;
  actor: Actor;
}

/** The signed-in user, or null when signed out (the server answers 401). */
export async function getMe(): Promise<Me | null> {
  try {
    return await api.get<Me>('/api/me');
  } catch (error) {
    if (isApiError(error) && error.status === 401) return null;
    throw error;
  }
}

export const getMeQueryOptions = () => queryOptions({ queryKey: ['me'], queryFn: getMe, staleTime: 60_000 });

export const useMe = () => useQuery(getMeQueryOptions());

/** The signed-in user, for screens inside the signed-in shell (which renders only once `/api/me` answered). */
export function useSignedInMe(): Me {
  const { data } = useMe();
  if (!data) throw new Error('useSignedInMe is only for screens inside the signed-in shell.');
  return data;
}
