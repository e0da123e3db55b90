import { Link } from 'react-router-dom';
import { paths } from '../../../config/paths';
import { cn } from '../../../lib/cn';
import type { Job } from '../api/get-jobs';
import { JobActions } from './job-actions';
import { formatTimeInState } from './job-format';
import { StaleBadge } from './job-state-badge';

/** One job on the board: who and what, how long it has waited, what comes next, and the moves at hand. */
export function JobCard({ job }: { job: Job }) {
  return (
    <article
      aria-labelledby={`job-card-${job.id}`}
      className={cn('flex flex-col gap-2 rounded-lg border bg-white p-3 text-sm shadow-xs', job.stale ? 'border-l-4 border-bad/60 border-l-bad' : 'border-ink-200')}
    >
      <header className="flex items-start justify-between gap-2">
        <h3 id={`job-card-${job.id}`} className="min-w-0 font-medium text-ink-900">
          <Link to={paths.job.getHref(job.id)} className="hover:underline">
            <span className="text-ink-600">#{job.number}</span> {job.vehicle.description}
          </Link>
        </h3>
        {job.stale && <StaleBadge />}
      </header>
      <dl className="grid grid-cols-[auto_1fr] gap-x-2 gap-y-0.5 text-xs text-ink-700">
        <dt className="text-ink-600">Customer</dt>
        <dd className="truncate">{job.customer.name}</dd>
        {job.dealer && (
          <>
            <dt className="text-ink-600">Dealer</dt>
            <dd className="truncate">{job.dealer.name}</dd>
          </>
        )}
        <dt className="text-ink-600">Tuner</dt>
        <dd className="truncate">{job.tuner?.name ?? <span className="italic">Unassigned</span>}</dd>
        <dt className="text-ink-600">Round</dt>
        <dd>{job.round === 0 ? 'No revision yet' : `Revision ${job.round}`}</dd>
        <dt className="text-ink-600">In state</dt>
        <dd className={cn(job.stale && 'font-semibold text-bad')}>
          {formatTimeInState(job.hoursInState)}
          {job.stale && ' — waiting too long'}
        </dd>
      </dl>
      <p className="text-xs text-ink-800">
        <span className="font-medium">Next: </span>
        {job.nextStep}
      </p>
      <JobActions job={job} compact />
    </article>
  );
}
