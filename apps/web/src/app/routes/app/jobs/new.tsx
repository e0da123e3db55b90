import { useNavigate, useSearchParams } from 'react-router-dom';
import { useAbility } from '@casl/react';
import type { AppAbility } from '@revloop/domain/auth';
import { PageHeader } from '../../../../components/layout/page-header';
import { EmptyState } from '../../../../components/ui/empty-state';
import { paths } from '../../../../config/paths';
import { useSignedInMe } from '../../../../features/auth/api/get-me';
import { JobIntakeForm } from '../../../../features/jobs/components/job-intake-form';

export function NewJobRoute() {
  const me = useSignedInMe();
  const ability = useAbility<AppAbility>();
  const navigate = useNavigate();
  const [search] = useSearchParams();
  if (!ability.can('create', 'Job')) {
    return <EmptyState title="You cannot open jobs here">Your account may read jobs but not open them.</EmptyState>;
  }
  return (
    <>
      <PageHeader
        title="Open a job"
        description={me.role === 'customer' ? 'Tell the shop about your vehicle and what you want from it.' : 'The customer, their vehicle, the package and what they want.'}
      />
      <JobIntakeForm
        me={me}
        customerUserId={search.get('customer') ?? undefined}
        onCancel={() => navigate(paths.jobs.getHref())}
        onDone={(job) => navigate(paths.job.getHref(job.id))}
      />
    </>
  );
}
