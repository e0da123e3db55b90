import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PackagesResponse } from '@revloop/contract';
import { api } from '../../../lib/api-client';

export const getPackages = () => api.get<PackagesResponse>('/api/packages');

export const getPackagesQueryOptions = () => queryOptions({ queryKey: ['packages'], queryFn: getPackages });

export const usePackages = () => useQuery(getPackagesQueryOptions());
