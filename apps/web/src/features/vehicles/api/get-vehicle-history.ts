import { queryOptions, useQuery } from '@tanstack/react-query';
import type { VehicleHistoryResponse } from '@revloop/contract';
import { api } from '../../../lib/api-client';
import { vehiclesRootKey } from './get-vehicles';

export const getVehicleHistory = (vehicleId: string) => api.get<VehicleHistoryResponse>(`/api/vehicles/${encodeURIComponent(vehicleId)}/history`);

export const getVehicleHistoryQueryOptions = (vehicleId: string) =>
  queryOptions({ queryKey: [...vehiclesRootKey, 'history', vehicleId], queryFn: () => getVehicleHistory(vehicleId) });

export const useVehicleHistory = (vehicleId: string) => useQuery(getVehicleHistoryQueryOptions(vehicleId));
