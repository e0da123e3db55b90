import { useAbility } from '@casl/react';
import type { AppAbility } from '@revloop/domain/auth';
import { PageHeader } from '../../../../components/layout/page-header';
import { buttonClasses } from '../../../../components/ui/button';
import { paths } from '../../../../config/paths';
import { useSignedInMe } from '../../../../features/auth/api/get-me';
import { CustomerPortal, DealerPortal } from '../../../../features/jobs/components/job-portal';
import { SetupChecklist } from '../../../../features/onboarding/components/setup-checklist';
import { JobsWorkspace } from '../../../../features/jobs/components/jobs-workspace';
import { Link } from 'react-router-dom';
import { RequireScreen } from '../require-screen';

function JobsScreen() {
  const me = useSignedInMe();
  const ability = useAbility<AppAbility>();
  const openJob = ability.can('create', 'Job') && (
    <Link to={paths.newJob.getHref()} className={buttonClasses()}>
      Open a job
    </Link>
  );
  if (me.role === 'customer') {
    return (
      <>
        <PageHeader title="My jobs" description="Your vehicles with the shop: where each job stands and what to do next." actions={openJob} />
        <CustomerPortal />
      </>
    );
  }
  if (me.role === 'dealer') {
    return (
      <>
        <PageHeader title="Jobs" description="Your customers' jobs with the shop and what each one needs next." actions={openJob} />
        <DealerPortal />
      </>
    );
  }
  return (
    <>
      <PageHeader title="Jobs" description="Every vehicle's calibration work, from the stock read to dialed in. Stale jobs are marked." actions={openJob} />
      {ability.can('read', 'ShopSettings') && <SetupChecklist />}
      <JobsWorkspace showMine={me.role === 'tuner'} />
    </>
  );
}

export function JobsRoute() {
  return (
    <RequireScreen screen="jobs">
      <JobsScreen />
    </RequireScreen>
  );
}
