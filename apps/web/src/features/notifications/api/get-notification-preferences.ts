import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ListResponse } from '../../../lib/api-client';

export interface NotificationPreference {
  kind: string;
  label: string;
  email: boolean;
}

export const getNotificationPreferences = () => api.get<ListResponse<NotificationPreference>>('/api/notifications/preferences');

export const getNotificationPreferencesQueryOptions = () =>
  queryOptions({ queryKey: ['notification-preferences'], queryFn: getNotificationPreferences });

export const useNotificationPreferences = () => useQuery(getNotificationPreferencesQueryOptions());
