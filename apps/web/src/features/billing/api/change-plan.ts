import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { Subscription } from '@revloop/contract';
import type { PlanId } from '@revloop/domain/billing';
import { api, type ItemResponse } from '../../../lib/api-client';
import { getMeQueryOptions } from '../../auth/api/get-me';
import { getSubscriptionQueryOptions } from './get-subscription';

/** Changes plan and seats of a running subscription from the next invoice on. */
export const changePlan = (input: { planId: PlanId; seats: number }) => api.post<ItemResponse<Subscription>>('/api/billing/subscription/plan', input);

export function useChangePlan() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: changePlan,
    onSuccess: async () => {
      await queryClient.invalidateQueries({ queryKey: getSubscriptionQueryOptions().queryKey });
      await queryClient.invalidateQueries({ queryKey: getMeQueryOptions().queryKey });
    },
  });
}
