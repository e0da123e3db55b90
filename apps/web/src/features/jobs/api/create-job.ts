import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Job } from '@revloop/contract';
import type { JobIntakeInput } from '@revloop/domain/jobs';
import { api, type ItemResponse } from '../../../lib/api-client';
import { customersRootKey } from '../../customers/api/get-customers';
import { vehiclesRootKey } from '../../vehicles/api/get-vehicles';
import { jobsRootKey } from './get-jobs';

export const createJob = (input: JobIntakeInput) => api.post<ItemResponse<Job>>('/api/jobs', input);

export function useCreateJob() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: createJob,
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: jobsRootKey });
      // A new job may have created a vehicle and a customer.
      await queryClient.invalidateQueries({ queryKey: vehiclesRootKey });
      await queryClient.invalidateQueries({ queryKey: customersRootKey });
    },
  });
}
