import { queryOptions, useQuery } from '@tanstack/react-query';
import type { Kit } from '@revloop/contract';
import { api, type ListResponse } from '../../../lib/api-client';

export const getKits = () => api.get<ListResponse<Kit>>('/api/kits');

/** Every kit query (list, page, calendar, overview) sits under this key, so one invalidation refreshes them all. */
export const kitsRootKey = ['kits'] as const;

export const getKitsQueryOptions = () => queryOptions({ queryKey: [...kitsRootKey, 'list'], queryFn: getKits });

export const useKits = (options: { enabled?: boolean } = {}) => useQuery({ ...getKitsQueryOptions(), ...options });
