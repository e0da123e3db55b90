import { JOB_STATE_LABELS, type OpenJobState } from '@revloop/domain/jobs';
import { Banner } from '../../../components/ui/banner';
import { PageSpinner } from '../../../components/ui/spinner';
import { errorMessage } from '../../../lib/form-errors';
import { useJobs, type Job } from '../api/get-jobs';
import { JobCard } from './job-card';
import { BOARD_STATES } from './job-format';
import { BOARD_PAGE_SIZE, boardParams, type JobsScreenState } from './job-list-params';

/** Open jobs in a column per state, oldest move first, so the longest waits sit at the top. */
export function JobBoard({ state }: { state: JobsScreenState }) {
  const jobs = useJobs(boardParams(state));
  if (jobs.isPending) return <PageSpinner label="Loading jobs" />;
  if (jobs.isError) return <Banner tone="bad">{errorMessage(jobs.error)}</Banner>;
  const byState = new Map<OpenJobState, Job[]>(BOARD_STATES.map((s) => [s, []]));
  for (const job of jobs.data.data) byState.get(job.state as OpenJobState)?.push(job);
  const { total } = jobs.data.meta;

  return (
    <div className="flex flex-col gap-3">
      {total > BOARD_PAGE_SIZE && (
        <Banner tone="warn">
          The board shows the {BOARD_PAGE_SIZE} longest-waiting of {total} open jobs. Narrow the filters or use the table view.
        </Banner>
      )}
      <div className="-mx-1 overflow-x-auto pb-2">
        <div className="flex min-w-max gap-3 px-1">
          {BOARD_STATES.map((s) => {
            const column = byState.get(s) ?? [];
            const stale = column.filter((job) => job.stale).length;
            return (
              <section key={s} aria-labelledby={`board-${s}`} className="flex w-64 shrink-0 flex-col gap-2 rounded-card bg-ink-100 p-2">
                <h2 id={`board-${s}`} className="flex items-baseline justify-between px-1 text-sm font-semibold text-ink-800">
                  <span>{JOB_STATE_LABELS[s]}</span>
                  <span className="text-xs font-normal text-ink-600">
                    {column.length} {column.length === 1 ? 'job' : 'jobs'}
                    {stale > 0 && `, ${stale} stale`}
                  </span>
                </h2>
                {column.length === 0 ? (
                  <p className="px-1 py-4 text-center text-xs text-ink-600">No jobs here.</p>
                ) : (
                  column.map((job) => <JobCard key={job.id} job={job} />)
                )}
              </section>
            );
          })}
        </div>
      </div>
    </div>
  );
}
