import { Link } from 'react-router-dom';
import type { Job } from '@revloop/contract';
import { JOB_STATE_LABELS } from '@revloop/domain/jobs';
import { paths } from '../../../config/paths';
import { cn } from '../../../lib/cn';
import { formatDate } from '../../../lib/format';
import { PROGRESS_STATES, progressIndex } from './job-format';
import { JobStateBadge } from './job-state-badge';
import { STATE_STYLES, StateIcon } from './job-state-style';
import { NextStepLine } from './next-step-line';

/** The normal path of a job as numbered steps, the current one named for screen readers too. */
export function JobSteps({ job }: { job: Job }) {
  const current = progressIndex(job.state, job.heldFrom);
  const stopped = job.state === 'on_hold' || job.state === 'cancelled';
  return (
    <ol aria-label="Progress" className="grid grid-cols-3 gap-1 sm:grid-cols-6">
      {PROGRESS_STATES.map((state, index) => {
        const done = index < current || job.state === 'dialed_in';
        const here = index === current && job.state !== 'dialed_in';
        return (
          <li key={state} aria-current={here ? 'step' : undefined} className="flex flex-col gap-1">
            <span aria-hidden="true" className={cn('h-1.5 rounded-full', done ? 'bg-accent-600' : here ? (stopped ? STATE_STYLES[job.state].bar : STATE_STYLES[state].bar) : 'bg-ink-200')} />
            <span className={cn('flex items-center gap-1 text-xs', here ? cn('font-semibold', STATE_STYLES[state].text) : done ? 'text-ink-700' : 'text-ink-500')}>
              {(here || done) && <StateIcon state={done ? 'dialed_in' : stopped ? job.state : state} />}
              {done && <span className="sr-only">Done: </span>}
              {here && <span className="sr-only">{stopped ? `${JOB_STATE_LABELS[job.state]} at: ` : 'Now: '}</span>}
              {JOB_STATE_LABELS[state]}
            </span>
          </li>
        );
      })}
    </ol>
  );
}

/** A job as its customer (or their dealer) follows it: where it is and, in plain words, what happens next. */
export function JobProgressCard({ job, showCustomer = false }: { job: Job; showCustomer?: boolean }) {
  return (
    <article aria-labelledby={`progress-${job.id}`} className="flex flex-col gap-3 rounded-card border border-ink-200 bg-white p-4 shadow-xs">
      <header className="flex flex-wrap items-start justify-between gap-2">
        <div className="min-w-0">
          <h3 id={`progress-${job.id}`} className="font-semibold text-ink-900">
            <Link to={paths.job.getHref(job.id)} className="hover:underline">
              Job {job.number}: {job.vehicle.description}
            </Link>
          </h3>
          <p className="text-sm text-ink-600">
            {showCustomer && `${job.customer.name} · `}
            {job.package.name} · opened {formatDate(job.createdAt)} · {job.round === 0 ? 'no revision yet' : `revision ${job.round}`}
          </p>
        </div>
        <JobStateBadge state={job.state} />
      </header>
      <JobSteps job={job} />
      <NextStepLine job={job} heading="Next:" payLabel={`Pay for job ${job.number}`} />
    </article>
  );
}
