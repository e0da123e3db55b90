import { useParams } from 'react-router-dom';
import { useAbility } from '@casl/react';
import { asSubject, type AppAbility } from '@revloop/domain/auth';
import { PageHeader } from '../../../../components/layout/page-header';
import { Banner } from '../../../../components/ui/banner';
import { PageSpinner } from '../../../../components/ui/spinner';
import { TextLink } from '../../../../components/ui/text-link';
import { paths } from '../../../../config/paths';
import { useSignedInMe } from '../../../../features/auth/api/get-me';
import { JobPaymentPanel } from '../../../../features/billing/components/job-payment-panel';
import { JobLogsPanel } from '../../../../features/datalogs/components/job-logs-panel';
import { JobFilesPanel } from '../../../../features/files/components/job-files-panel';
import { useJob } from '../../../../features/jobs/api/get-job';
import { JobSummary } from '../../../../features/jobs/components/job-summary';
import { JobTimeline } from '../../../../features/jobs/components/job-timeline';
import { LogRequestCard } from '../../../../features/jobs/components/log-request-card';
import { MessageThread } from '../../../../features/jobs/components/message-thread';
import { GoalsCard } from '../../../../features/jobs/components/special-requests-card';
import { JobKitPanel } from '../../../../features/rentals/components/job-kit-panel';
import { cn } from '../../../../lib/cn';
import { errorMessage } from '../../../../lib/form-errors';

export function JobRoute() {
  const { jobId = '' } = useParams();
  const me = useSignedInMe();
  const ability = useAbility<AppAbility>();
  const job = useJob(jobId);

  if (job.isPending) return <PageSpinner label="Loading the job" />;
  if (job.isError) {
    return (
      <Banner tone="bad" title="This job could not be opened">
        {errorMessage(job.error)} <TextLink to={paths.jobs.getHref()}>Back to jobs</TextLink>
      </Banner>
    );
  }
  const data = job.data.data;
  // CASL tags the object it checks, so each subject type gets its own copy of the job's fields.
  const fields = { shopId: me.shop?.id ?? '', assignedTunerId: data.tuner?.id ?? null, dealerId: data.dealer?.id ?? null, customerUserId: data.customer.id };
  const canEditLogRequest = ability.can('update', asSubject('Job', { ...fields }));
  const canPost = ability.can('create', asSubject('Message', { ...fields }));
  // The customer comes to pay, answer and see what is next; the working panels follow on a phone.
  const later = cn('min-w-0', me.role === 'customer' && 'order-last xl:order-none');

  return (
    <>
      <PageHeader title={`Job ${data.number}`} description={data.vehicle.description} actions={<TextLink to={paths.jobs.getHref()}>All jobs</TextLink>} />
      {/* Below xl the two columns dissolve into one list; a customer's follows `order`: next step, payment, messages first. */}
      <div className="grid gap-6 xl:grid-cols-[minmax(0,1fr)_24rem]">
        <div className="contents xl:flex xl:min-w-0 xl:flex-col xl:gap-6">
          <JobSummary job={data} canSeeVehicle={ability.can('read', 'Vehicle')} />
          <div className={later}>
            <JobFilesPanel jobId={data.id} job={data} />
          </div>
          <div className={later}>
            <LogRequestCard jobId={data.id} request={data.logRequest} canEdit={canEditLogRequest} />
          </div>
          <div className={later}>
            <JobLogsPanel jobId={data.id} job={data} requestShown />
          </div>
          <div className={later}>
            <GoalsCard goals={data.goals} requests={data.specialRequests} units={me.user.unitSystem} />
          </div>
        </div>
        <div className="contents xl:flex xl:min-w-0 xl:flex-col xl:gap-6">
          <JobPaymentPanel jobId={data.id} job={data} />
          <JobKitPanel jobId={data.id} />
          <MessageThread jobId={data.id} canPost={canPost} />
          <div className={later}>
            <JobTimeline entries={data.timeline} />
          </div>
        </div>
      </div>
    </>
  );
}
