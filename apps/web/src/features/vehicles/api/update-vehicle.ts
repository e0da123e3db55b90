import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { VehicleFormValues } from '@revloop/domain/vehicles';
import { apiRequest, type ItemResponse } from '../../../lib/api-client';
import type { Vehicle } from '@revloop/contract';
import { vehiclesRootKey } from './get-vehicles';

export const updateVehicle = ({ vehicleId, vehicle }: { vehicleId: string; vehicle: VehicleFormValues }) =>
  apiRequest<ItemResponse<Vehicle>>('PUT', `/api/vehicles/${encodeURIComponent(vehicleId)}`, vehicle);

export function useUpdateVehicle() {
  const queryClient = useQueryClient();
  return useMutation({ mutationFn: updateVehicle, onSuccess: () => queryClient.invalidateQueries({ queryKey: vehiclesRootKey }) });
}
