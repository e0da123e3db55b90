import { useMutation, useQueryClient } from '@tanstack/react-query';
import { api, type ItemResponse } from '../../../lib/api-client';
import { getNotificationsQueryOptions } from './get-notifications';

/** Marks the given notifications read, or all of them when `ids` is left out. */
export const markNotificationsRead = (ids?: string[]) => api.post<ItemResponse<{ unread: number }>>('/api/notifications/read', ids ? { ids } : {});

export function useMarkNotificationsRead() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: markNotificationsRead,
    onSuccess: () => queryClient.invalidateQueries({ queryKey: getNotificationsQueryOptions().queryKey }),
  });
}
