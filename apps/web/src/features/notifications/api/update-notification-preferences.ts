import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { NotificationPreference } from '@revloop/contract';
import { apiRequest, type ListResponse } from '../../../lib/api-client';
import { getNotificationPreferencesQueryOptions } from './get-notification-preferences';

export type NotificationPrefsInput = Record<string, { email: boolean }>;

export const updateNotificationPreferences = (prefs: NotificationPrefsInput) =>
  apiRequest<ListResponse<NotificationPreference>>('PUT', '/api/notifications/preferences', { prefs });

export function useUpdateNotificationPreferences() {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: updateNotificationPreferences,
    onSuccess: (response) => queryClient.setQueryData(getNotificationPreferencesQueryOptions().queryKey, response),
  });
}
