import type { QueryClient } from '@tanstack/react-query';
import { jobsRootKey } from '../../jobs/api/get-jobs';
import { kitsRootKey } from '../../kits/api/get-kits';
import { rentalsRootKey } from './get-rentals';

/** A rental change moves its kit's status and calendar and adds to the job's timeline: refresh all three. */
export async function invalidateRentals(queryClient: QueryClient): Promise<void> {
  await Promise.all([rentalsRootKey, kitsRootKey, jobsRootKey].map((queryKey) => queryClient.invalidateQueries({ queryKey })));
}
