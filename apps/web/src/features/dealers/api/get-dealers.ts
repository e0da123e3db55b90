import { queryOptions, useQuery } from '@tanstack/react-query';
import type { DealerListItem } from '@revloop/contract';
import { api, type ListResponse } from '../../../lib/api-client';

export const getDealers = () => api.get<ListResponse<DealerListItem>>('/api/dealers');

export const getDealersQueryOptions = () => queryOptions({ queryKey: ['dealers'], queryFn: getDealers });

export const useDealers = (options: { enabled?: boolean } = {}) => useQuery({ ...getDealersQueryOptions(), ...options });
