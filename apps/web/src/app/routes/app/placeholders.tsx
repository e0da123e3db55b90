import { JobsPlaceholder } from '../../../features/jobs/components/jobs-placeholder';
import { useSignedInMe } from '../../../features/auth/api/get-me';
import { RequireAbility } from './require-ability';

export function JobsRoute() {
  const me = useSignedInMe();
  return (
    <RequireAbility action="read" subject="Job">
      <JobsPlaceholder kind={me.role === 'customer' ? 'my-jobs' : 'jobs'} />
    </RequireAbility>
  );
}

export function VehiclesRoute() {
  return (
    <RequireAbility action="read" subject="Vehicle">
      <JobsPlaceholder kind="vehicles" />
    </RequireAbility>
  );
}

export function CustomersRoute() {
  return (
    <RequireAbility action="read" subject="Customer">
      <JobsPlaceholder kind="customers" />
    </RequireAbility>
  );
}
