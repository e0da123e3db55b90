import { queryOptions, useQuery } from '@tanstack/react-query';
import { api, type ListResponse } from '../../../lib/api-client';

/** A customer of the shop; a dealer sees only its own. */
export interface Customer {
  id: string;
  name: string;
  email: string;
  dealer: { id: string; name: string } | null;
  since: string;
}

export const getCustomers = () => api.get<ListResponse<Customer>>('/api/customers');

export const getCustomersQueryOptions = () => queryOptions({ queryKey: ['customers'], queryFn: getCustomers });

export const useCustomers = (options: { enabled?: boolean } = {}) => useQuery({ ...getCustomersQueryOptions(), ...options });
