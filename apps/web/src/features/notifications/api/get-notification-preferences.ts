import { queryOptions, useQuery } from '@tanstack/react-query';
import type { NotificationPreference } from '@revloop/contract';
import { api, type ListResponse } from '../../../lib/api-client';

export const getNotificationPreferences = () => api.get<ListResponse<NotificationPreference>>('/api/notifications/preferences');

export const getNotificationPreferencesQueryOptions = () =>
  queryOptions({ queryKey: ['notification-preferences'], queryFn: getNotificationPreferences });

export const useNotificationPreferences = () => useQuery(getNotificationPreferencesQueryOptions());
