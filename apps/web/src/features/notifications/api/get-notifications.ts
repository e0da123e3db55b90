import { queryOptions, useQuery } from '@tanstack/react-query';
import { api } from '../../../lib/api-client';

export interface Notification {
  id: string;
  kind: string;
  title: string;
  body: string;
  jobId: string | null;
  readAt: string | null;
  createdAt: string;
}

export interface NotificationsResponse {
  data: Notification[];
  meta: { total: number; unread: number };
}

export const getNotifications = () => api.get<NotificationsResponse>('/api/notifications');

export const getNotificationsQueryOptions = () => queryOptions({ queryKey: ['notifications'], queryFn: getNotifications });

/** Polled once a minute so the bell picks up what others did. */
export const useNotifications = () => useQuery({ ...getNotificationsQueryOptions(), refetchInterval: 60_000 });
