import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ListResponse } from '../../../lib/api-client';

export interface Dealer {
  id: string;
  name: string;
  contactName: string;
  contactEmail: string;
  phone: string | null;
  userCount: number;
  createdAt: string;
}

export const getDealers = () => api.get<ListResponse<Dealer>>('/api/dealers');

export const getDealersQueryOptions = () => queryOptions({ queryKey: ['dealers'], queryFn: getDealers });

export const useDealers = (options: { enabled?: boolean } = {}) => useQuery({ ...getDealersQueryOptions(), ...options });
