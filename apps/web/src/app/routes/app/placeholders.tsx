import { JobsPlaceholder } from '../../../features/jobs/components/jobs-placeholder';
import { useSignedInMe } from '../../../features/auth/api/get-me';
import { RequireScreen } from './require-screen';

export function JobsRoute() {
  const me = useSignedInMe();
  return (
    <RequireScreen screen="jobs">
      <JobsPlaceholder kind={me.role === 'customer' ? 'my-jobs' : 'jobs'} />
    </RequireScreen>
  );
}

export function VehiclesRoute() {
  return (
    <RequireScreen screen="vehicles">
      <JobsPlaceholder kind="vehicles" />
    </RequireScreen>
  );
}

export function CustomersRoute() {
  return (
    <RequireScreen screen="customers">
      <JobsPlaceholder kind="customers" />
    </RequireScreen>
  );
}
