import { queryOptions, useQuery } from '@tanstack/react-query';
import type { NotificationsResponse } from '@revloop/contract';
import { api } from '../../../lib/api-client';

export const getNotifications = () => api.get<NotificationsResponse>('/api/notifications');

export const getNotificationsQueryOptions = () => queryOptions({ queryKey: ['notifications'], queryFn: getNotifications });

/** Polled once a minute so the bell picks up what others did. */
export const useNotifications = () => useQuery({ ...getNotificationsQueryOptions(), refetchInterval: 60_000 });
