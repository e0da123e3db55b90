import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Vehicle } from '@revloop/contract';
import { api, type ListResponse } from '../../../lib/api-client';

export const getVehicles = (ownerUserId?: string) =>
  api.get<ListResponse<Vehicle>>(ownerUserId ? `/api/vehicles?owner=${encodeURIComponent(ownerUserId)}` : '/api/vehicles');

/** Every vehicle query sits under this key. */
export const vehiclesRootKey = ['vehicles'] as const;

export const getVehiclesQueryOptions = (ownerUserId?: string) =>
  queryOptions({ queryKey: [...vehiclesRootKey, 'list', ownerUserId ?? 'all'], queryFn: () => getVehicles(ownerUserId) });

export const useVehicles = (ownerUserId?: string, options: { enabled?: boolean } = {}) => useQuery({ ...getVehiclesQueryOptions(ownerUserId), ...options });
