import { queryOptions, useQuery } from '@tanstack/react-query';
import type { PackageModule } from '@revloop/domain/jobs';
import { api } from '../../../lib/api-client';

/** What the shop sells; prices in integer minor units of `meta.currency`. Customers never see the dealer price. */
export interface Package {
  id: string;
  name: string;
  description: string;
  modules: PackageModule[];
  retailPriceMinor: number;
  dealerPriceMinor: number | null;
  roundsIncluded: number;
  active: boolean;
  createdAt: string;
}

export interface PackagesResponse {
  data: Package[];
  meta: { total: number; currency: string };
}

export const getPackages = () => api.get<PackagesResponse>('/api/packages');

export const getPackagesQueryOptions = () => queryOptions({ queryKey: ['packages'], queryFn: getPackages });

export const usePackages = () => useQuery(getPackagesQueryOptions());
