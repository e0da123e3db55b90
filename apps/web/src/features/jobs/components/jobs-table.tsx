import { Link } from 'react-router-dom';
import {
  createColumnHelper,
  functionalUpdate,
  rowPaginationFeature,
  rowSortingFeature,
  tableFeatures,
  useTable,
  type PaginationState,
  type SortingState,
  type Updater,
} from '@tanstack/react-table';
import { type Job, JOB_SORT_KEYS, type JobSortKey } from '@revloop/contract';
import { Banner } from '../../../components/ui/banner';
import { buttonClasses } from '../../../components/ui/button';
import { Spinner } from '../../../components/ui/spinner';
import { TablePager } from '../../../components/ui/table-pager';
import { TableView } from '../../../components/ui/table-view';
import { textLinkClasses } from '../../../components/ui/text-link';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/form-errors';
import { formatDateTime } from '../../../lib/format';
import { getJobsExportHref } from '../api/export-jobs';
import { useJobs } from '../api/get-jobs';
import { formatTimeInState } from './job-format';
import { PAGE_SIZES, tableParams, type JobsScreenState } from './job-list-params';
import { ApprovalBadge, JobStateBadge, StaleBadge } from './job-state-badge';

// Sorting and paging happen on the server: the table only renders the page it is given and reports clicks.
const features = tableFeatures({ rowSortingFeature, rowPaginationFeature });
const helper = createColumnHelper<typeof features, Job>();

const columns = helper.columns([
  helper.accessor('number', {
    id: 'number',
    header: 'Job',
    cell: (info) => (
      <Link to={paths.job.getHref(info.row.original.id)} className={textLinkClasses}>
        #{info.getValue()}
      </Link>
    ),
  }),
  helper.accessor('state', {
    id: 'state',
    header: 'State',
    cell: (info) => (
      <span className="flex flex-col items-start gap-1">
        <JobStateBadge state={info.getValue()} />
        {info.row.original.draftsAwaitingApproval > 0 && <ApprovalBadge />}
      </span>
    ),
  }),
  helper.accessor((job) => job.vehicle.description, { id: 'vehicle', header: 'Vehicle', cell: (info) => <span className="line-clamp-2 block min-w-36 whitespace-normal">{info.getValue()}</span> }),
  helper.accessor((job) => job.customer.name, { id: 'customer', header: 'Customer', cell: (info) => <span className="block whitespace-normal">{info.getValue()}</span> }),
  helper.accessor((job) => job.dealer?.name ?? '', { id: 'dealer', header: 'Dealer', enableSorting: false, cell: (info) => <span className="block whitespace-normal">{info.getValue() || '—'}</span> }),
  helper.accessor((job) => job.package.name, { id: 'package', header: 'Package', enableSorting: false, cell: (info) => <span className="block min-w-24 whitespace-normal">{info.getValue()}</span> }),
  helper.accessor((job) => job.tuner?.name ?? '', { id: 'tuner', header: 'Tuner', enableSorting: false, cell: (info) => <span className="block whitespace-normal">{info.getValue() || 'Unassigned'}</span> }),
  helper.accessor('round', { id: 'round', header: 'Round' }),
  helper.accessor('stateChangedAt', {
    id: 'state_changed',
    header: 'In state',
    cell: (info) => (
      <span className="flex flex-col items-start gap-1">
        {formatTimeInState(info.row.original.hoursInState)}
        {info.row.original.stale && <StaleBadge />}
      </span>
    ),
  }),
  helper.accessor('updatedAt', { id: 'updated', header: 'Updated', cell: (info) => <span className="block whitespace-normal">{formatDateTime(info.getValue())}</span> }),
]);

export interface JobsTableProps {
  state: JobsScreenState;
  onChange: (patch: Partial<JobsScreenState>) => void;
}

/** Every job the viewer may see, a page at a time, with the server's sort and filters; exports the filtered list. */
export function JobsTable({ state, onChange }: JobsTableProps) {
  const params = tableParams(state);
  const jobs = useJobs(params);
  const sorting: SortingState = [{ id: state.sort, desc: state.dir === 'desc' }];
  const pagination: PaginationState = { pageIndex: state.page - 1, pageSize: state.pageSize };

  const table = useTable({
    features,
    columns,
    data: jobs.data?.data ?? [],
    getRowId: (job) => job.id,
    state: { sorting, pagination },
    manualSorting: true,
    manualPagination: true,
    enableMultiSort: false,
    enableSortingRemoval: false,
    rowCount: jobs.data?.meta.total ?? 0,
    onSortingChange: (updater: Updater<SortingState>) => {
      const [next] = functionalUpdate(updater, sorting);
      if (next && (JOB_SORT_KEYS as readonly string[]).includes(next.id)) onChange({ sort: next.id as JobSortKey, dir: next.desc ? 'desc' : 'asc', page: 1 });
    },
    onPaginationChange: (updater: Updater<PaginationState>) => {
      const next = functionalUpdate(updater, pagination);
      onChange({ page: next.pageIndex + 1, pageSize: next.pageSize });
    },
  });

  if (jobs.isError) return <Banner tone="bad">{errorMessage(jobs.error)}</Banner>;
  const meta = jobs.data?.meta;

  const filtered = Boolean(state.q || state.tuner || state.dealer || state.package || state.customer || state.mine || state.state);
  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-center justify-between gap-3 text-sm text-ink-700">
        <p aria-live="polite">
          {meta ? `${meta.total} ${meta.total === 1 ? 'job' : 'jobs'}` : 'Loading jobs'}
          {jobs.isFetching && <Spinner label="Updating" className="ml-2 align-middle" />}
        </p>
        <a href={getJobsExportHref(params)} download className={buttonClasses('secondary', 'sm')}>
          Export CSV
        </a>
      </div>
      <TableView
        table={table}
        dense
        minWidthClass="min-w-[56rem]"
        caption={`Jobs, sorted by ${state.sort.replace('_', ' ')} ${state.dir === 'asc' ? 'ascending' : 'descending'}`}
        emptyMessage={jobs.isPending ? 'Loading…' : filtered ? 'No job matches the filters.' : 'No jobs yet: open one with "Open a job", or share your public page so customers start a tune themselves.'}
      />
      <TablePager table={table} page={state.page} pageSize={state.pageSize} pageSizes={PAGE_SIZES} />
    </div>
  );
}
