import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Mail } from '@revloop/contract';
import { api, type ListResponse } from '../../../lib/api-client';

/** Mails caught by the development SMTP server; the endpoint is 404 in production. */
export const getMailbox = () => api.get<ListResponse<Mail>>('/api/dev/mailbox');

export const getMailboxQueryOptions = () => queryOptions({ queryKey: ['dev', 'mailbox'], queryFn: getMailbox });

export const useMailbox = (options: { enabled?: boolean; refetchInterval?: number } = {}) =>
  useQuery({ ...getMailboxQueryOptions(), ...options });
