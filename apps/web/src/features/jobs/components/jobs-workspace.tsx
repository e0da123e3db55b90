import { useCallback } from 'react';
import { useSearchParams } from 'react-router-dom';
import { JobBoard } from './job-board';
import { JobFilters } from './job-filters';
import { readJobsScreenState, writeJobsScreenState, type JobsScreenState } from './job-list-params';
import { JobsTable } from './jobs-table';
import { cn } from '../../../lib/cn';

const toggleClasses = (active: boolean) =>
  cn('px-3 py-1.5 text-sm font-medium first:rounded-l-lg last:rounded-r-lg', active ? 'bg-accent-600 text-white' : 'bg-white text-ink-700 hover:bg-ink-100');

/** The shop's view of its jobs: a board of open work or a table of everything, filters kept in the URL. */
export function JobsWorkspace({ showMine }: { showMine: boolean }) {
  const [search, setSearch] = useSearchParams();
  const state = readJobsScreenState(search);
  const update = useCallback(
    (patch: Partial<JobsScreenState>) => setSearch((current) => writeJobsScreenState({ ...readJobsScreenState(current), ...patch }), { replace: true }),
    [setSearch],
  );

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <JobFilters state={state} onChange={update} showMine={showMine} showState={state.view === 'table'} />
        <div role="group" aria-label="View" className="inline-flex rounded-lg border border-ink-300">
          <button type="button" aria-pressed={state.view === 'board'} className={toggleClasses(state.view === 'board')} onClick={() => update({ view: 'board' })}>
            Board
          </button>
          <button type="button" aria-pressed={state.view === 'table'} className={toggleClasses(state.view === 'table')} onClick={() => update({ view: 'table' })}>
            Table
          </button>
        </div>
      </div>
      {state.view === 'table' ? <JobsTable state={state} onChange={update} /> : <JobBoard state={state} />}
    </div>
  );
}
