import { Link } from 'react-router-dom';
import type { Job } from '@revloop/contract';
import { paths } from '../../../config/paths';
import { cn } from '../../../lib/cn';
import { JobActions } from './job-actions';
import { formatTimeInState } from './job-format';
import { ApprovalBadge, StaleBadge } from './job-state-badge';

/** One job on the board, compact enough for six columns on a laptop: who and what, how long, what next, the moves. */
export function JobCard({ job }: { job: Job }) {
  return (
    <article
      aria-labelledby={`job-card-${job.id}`}
      className={cn('flex min-w-0 flex-col gap-1 rounded-lg border bg-white p-2 text-xs text-ink-700 shadow-xs', job.stale ? 'border-l-4 border-bad/60 border-l-bad' : 'border-ink-200')}
    >
      <h3 id={`job-card-${job.id}`} className="line-clamp-2 text-sm font-medium text-ink-900" title={job.vehicle.description}>
        <Link to={paths.job.getHref(job.id)} className="hover:underline">
          <span className="text-ink-600">#{job.number}</span> {job.vehicle.description}
        </Link>
      </h3>
      {(job.stale || job.draftsAwaitingApproval > 0) && (
        <p className="flex flex-wrap gap-1">
          {job.stale && <StaleBadge />}
          {job.draftsAwaitingApproval > 0 && <ApprovalBadge />}
        </p>
      )}
      <p className="truncate">
        {job.customer.name}
        {job.dealer && <span className="text-ink-600"> via {job.dealer.name}</span>}
      </p>
      <p className="truncate">
        <span className="sr-only">Tuner: </span>
        {job.tuner?.name ?? <span className="italic">Unassigned</span>}
      </p>
      <p className={cn(job.stale && 'font-semibold text-bad')}>
        {job.round === 0 ? 'No revision yet' : `Revision ${job.round}`} · {formatTimeInState(job.hoursInState)} in state
      </p>
      <p className="line-clamp-3 text-ink-800">
        <span className="font-medium">Next: </span>
        {job.nextStep}
      </p>
      <JobActions job={job} compact />
    </article>
  );
}
