import { Link } from 'react-router-dom';
import type { Job } from '@revloop/contract';
import { Card } from '../../../components/ui/card';
import { textLinkClasses } from '../../../components/ui/text-link';
import { paths } from '../../../config/paths';
import { formatDateTime } from '../../../lib/format';
import { JobActions } from './job-actions';
import { formatTimeInState } from './job-format';
import { JobSteps } from './job-progress';
import { JobStateBadge, StaleBadge } from './job-state-badge';
import { NextStepLine } from './next-step-line';

/** The head of the job page: who and what, where it stands, the next step in plain words and the moves at hand. */
export function JobSummary({ job, canSeeVehicle }: { job: Job; canSeeVehicle: boolean }) {
  return (
    <Card>
      <div className="flex flex-col gap-4">
        <div className="flex flex-wrap items-center gap-2">
          <JobStateBadge state={job.state} />
          {job.stale && <StaleBadge />}
          <span className="text-sm text-ink-600">
            {formatTimeInState(job.hoursInState)} in {job.stateLabel} (since {formatDateTime(job.stateChangedAt)})
          </span>
        </div>
        <dl className="grid gap-x-6 gap-y-2 text-sm sm:grid-cols-[auto_1fr_auto_1fr]">
          <dt className="text-ink-600">Vehicle</dt>
          <dd className="text-ink-900">
            {canSeeVehicle ? (
              <Link to={paths.vehicle.getHref(job.vehicle.id)} className={textLinkClasses}>
                {job.vehicle.description}
              </Link>
            ) : (
              job.vehicle.description
            )}
            <span className="block font-mono text-xs text-ink-600">
              {job.vehicle.vin} · {job.vehicle.modelYear}
            </span>
          </dd>
          <dt className="text-ink-600">Customer</dt>
          <dd className="text-ink-900">
            {job.customer.name}
            <span className="block text-xs text-ink-600">{job.customer.email}</span>
          </dd>
          <dt className="text-ink-600">Package</dt>
          <dd className="text-ink-900">{job.package.name}</dd>
          <dt className="text-ink-600">Dealer</dt>
          <dd className="text-ink-900">{job.dealer?.name ?? '—'}</dd>
          <dt className="text-ink-600">Tuner</dt>
          <dd className="text-ink-900">{job.tuner?.name ?? 'Unassigned'}</dd>
          <dt className="text-ink-600">Round</dt>
          <dd className="text-ink-900">{job.round === 0 ? 'No revision sent yet' : `Revision ${job.round} sent`}</dd>
        </dl>
        <JobSteps job={job} />
        <NextStepLine job={job} heading="Next step:" payLabel="Pay for this job" />
        <JobActions job={job} />
      </div>
    </Card>
  );
}
