import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CircumferenceSource, SpeedTableRow, VehicleInput, VinRegion } from '@revloop/domain/vehicles';
import { api, type ListResponse } from '../../../lib/api-client';

/** A vehicle with what its numbers mean, computed by the server from the same domain code. */
export interface Vehicle {
  id: string;
  owner: { id: string; name: string; email: string };
  dealerId: string | null;
  vin: string;
  vinRegion: VinRegion | null;
  /** Notes on the VIN, e.g. that VINs from its region encode no model year. */
  vinWarnings: string[];
  modelYear: number;
  description: string;
  spec: VehicleInput;
  derived: {
    tyreDiameterMm: number;
    /** Unloaded, from the tyre size. */
    tyreCircumferenceMm: number;
    /** What the speeds and the datalog analysis use: measured when given, else the tyre size's. */
    rollingCircumferenceMm: number;
    circumferenceSource: CircumferenceSource;
    stoichAfr: number;
    speeds: SpeedTableRow[];
  } | null;
  createdAt: string;
}

export const getVehicles = (ownerUserId?: string) =>
  api.get<ListResponse<Vehicle>>(ownerUserId ? `/api/vehicles?owner=${encodeURIComponent(ownerUserId)}` : '/api/vehicles');

/** Every vehicle query sits under this key. */
export const vehiclesRootKey = ['vehicles'] as const;

export const getVehiclesQueryOptions = (ownerUserId?: string) =>
  queryOptions({ queryKey: [...vehiclesRootKey, 'list', ownerUserId ?? 'all'], queryFn: () => getVehicles(ownerUserId) });

export const useVehicles = (ownerUserId?: string, options: { enabled?: boolean } = {}) => useQuery({ ...getVehiclesQueryOptions(ownerUserId), ...options });
