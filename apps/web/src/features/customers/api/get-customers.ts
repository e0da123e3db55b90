import { keepPreviousData, queryOptions, useQuery } from '@tanstack/react-query';
import type { CustomerListItem, CustomerListQuery, CustomerListResponse } from '@revloop/contract';
import { api } from '../../../lib/api-client';

/** A customer of the shop as the list shows it; a dealer sees only its own. */
export type Customer = CustomerListItem;

export const customersRootKey = ['customers'] as const;

/** The query string with only the parameters that are set, in a stable order. */
export function customerListSearch(params: CustomerListQuery): string {
  const search = new URLSearchParams();
  if (params.q?.trim()) search.set('q', params.q.trim());
  if (params.sort) search.set('sort', params.sort);
  if (params.dir) search.set('dir', params.dir);
  if (params.page && Number(params.page) > 1) search.set('page', String(params.page));
  if (params.pageSize) search.set('pageSize', String(params.pageSize));
  return search.toString();
}

export const getCustomers = (params: CustomerListQuery) => api.get<CustomerListResponse>(`/api/customers?${customerListSearch(params)}`);

export const getCustomersQueryOptions = (params: CustomerListQuery = PICKER) =>
  queryOptions({ queryKey: [...customersRootKey, 'list', params], queryFn: () => getCustomers(params), placeholderData: keepPreviousData });

/** Pickers (new job, job filters) take the first 500 by name; the Customers screen pages through all of them. */
const PICKER: CustomerListQuery = { sort: 'name', dir: 'asc', pageSize: 500 };

export const useCustomers = (options: { enabled?: boolean } = {}) => useQuery({ ...getCustomersQueryOptions(), ...options });

export const useCustomerList = (params: CustomerListQuery) => useQuery(getCustomersQueryOptions(params));
