import { useParams } from 'react-router-dom';
import { PageHeader } from '../../../../components/layout/page-header';
import { Banner } from '../../../../components/ui/banner';
import { PageSpinner } from '../../../../components/ui/spinner';
import { useJob } from '../../../../features/jobs/api/get-job';
import { JobLogsPanel } from '../../../../features/datalogs/components/job-logs-panel';
import { isApiError } from '../../../../lib/api-client';
import { errorMessage } from '../../../../lib/form-errors';

/** A job's logs on their own page: the panel the job page shows, reachable from a report's back link. */
export function JobLogsRoute() {
  const { jobId = '' } = useParams();
  const job = useJob(jobId);
  if (job.isPending) return <PageSpinner label="Loading the job" />;
  if (job.isError) {
    const missing = isApiError(job.error) && job.error.status === 404;
    return (
      <Banner tone={missing ? 'warn' : 'bad'} title={missing ? 'Job not found' : 'The job could not be loaded'}>
        {missing ? 'There is no job with this address that you can open.' : errorMessage(job.error)}
      </Banner>
    );
  }
  const detail = job.data.data;
  return (
    <>
      <PageHeader title={`Logs of job ${detail.number}`} description={`${detail.vehicle.description} · ${detail.customer.name} · ${detail.stateLabel}`} />
      <JobLogsPanel jobId={detail.id} job={detail} />
    </>
  );
}
