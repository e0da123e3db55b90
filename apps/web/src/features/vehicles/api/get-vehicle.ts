import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ItemResponse } from '../../../lib/api-client';
import type { Vehicle } from '@revloop/contract';
import { vehiclesRootKey } from './get-vehicles';

export const getVehicle = (vehicleId: string) => api.get<ItemResponse<Vehicle>>(`/api/vehicles/${encodeURIComponent(vehicleId)}`);

export const getVehicleQueryOptions = (vehicleId: string) =>
  queryOptions({ queryKey: [...vehiclesRootKey, 'detail', vehicleId], queryFn: () => getVehicle(vehicleId) });

export const useVehicle = (vehicleId: string) => useQuery(getVehicleQueryOptions(vehicleId));
