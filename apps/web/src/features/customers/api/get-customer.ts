import { queryOptions, useQuery } from '@tanstack/react-query';
import type { CustomerDetail } from '@revloop/contract';
import { api, type ItemResponse } from '../../../lib/api-client';
import { customersRootKey } from './get-customers';

export const getCustomer = (customerId: string) => api.get<ItemResponse<CustomerDetail>>(`/api/customers/${encodeURIComponent(customerId)}`);

export const getCustomerQueryOptions = (customerId: string) =>
  queryOptions({ queryKey: [...customersRootKey, 'detail', customerId], queryFn: () => getCustomer(customerId) });

export const useCustomer = (customerId: string) => useQuery(getCustomerQueryOptions(customerId));
