import { JOB_SORT_KEYS, type JobSortKey } from '@revloop/contract';
import { isJobState, type JobState } from '@revloop/domain/jobs';
import { type JobListParams } from '../api/get-jobs';

export type JobsView = 'board' | 'table';

/** What the jobs screen shows, as kept in the address bar so a filtered view can be shared and reloaded. */
export interface JobsScreenState {
  view: JobsView;
  q: string;
  tuner: string;
  dealer: string;
  package: string;
  customer: string;
  mine: boolean;
  /** Only jobs with a revision draft waiting for a second person's approval. */
  awaitingApproval: boolean;
  /** Table only: '' any state, 'open' every open state, or one state. */
  state: '' | 'open' | JobState;
  sort: JobSortKey;
  dir: 'asc' | 'desc';
  page: number;
  pageSize: number;
}

export const PAGE_SIZES = [25, 50, 100] as const;
const DEFAULT_PAGE_SIZE = 25;

const isSortKey = (value: string | null): value is JobSortKey => (JOB_SORT_KEYS as readonly (string | null)[]).includes(value);

/** Reads the screen state from the URL; anything unknown falls back to its default rather than failing. */
export function readJobsScreenState(search: URLSearchParams): JobsScreenState {
  const page = Number(search.get('page'));
  const pageSize = Number(search.get('pageSize'));
  const rawState = search.get('state');
  const sort = search.get('sort');
  return {
    view: search.get('view') === 'table' ? 'table' : 'board',
    q: search.get('q') ?? '',
    tuner: search.get('tuner') ?? '',
    dealer: search.get('dealer') ?? '',
    package: search.get('package') ?? '',
    customer: search.get('customer') ?? '',
    mine: search.get('mine') === 'true',
    awaitingApproval: search.get('awaiting') === 'approval',
    state: rawState === 'open' ? 'open' : isJobState(rawState) ? rawState : '',
    sort: isSortKey(sort) ? sort : 'updated',
    dir: search.get('dir') === 'asc' ? 'asc' : 'desc',
    page: Number.isInteger(page) && page > 1 ? page : 1,
    pageSize: (PAGE_SIZES as readonly number[]).includes(pageSize) ? pageSize : DEFAULT_PAGE_SIZE,
  };
}

/** Writes only what differs from the defaults, so a plain `/jobs` stays plain. */
export function writeJobsScreenState(state: JobsScreenState): URLSearchParams {
  const search = new URLSearchParams();
  if (state.view === 'table') search.set('view', 'table');
  if (state.q) search.set('q', state.q);
  if (state.mine) search.set('mine', 'true');
  else if (state.tuner) search.set('tuner', state.tuner);
  if (state.awaitingApproval) search.set('awaiting', 'approval');
  if (state.dealer) search.set('dealer', state.dealer);
  if (state.package) search.set('package', state.package);
  if (state.customer) search.set('customer', state.customer);
  if (state.state) search.set('state', state.state);
  if (state.sort !== 'updated') search.set('sort', state.sort);
  if (state.dir !== 'desc') search.set('dir', state.dir);
  if (state.page > 1) search.set('page', String(state.page));
  if (state.pageSize !== DEFAULT_PAGE_SIZE) search.set('pageSize', String(state.pageSize));
  return search;
}

/** The filters every view shares. */
function filterParams(state: JobsScreenState): JobListParams {
  return {
    ...(state.q.trim() && { q: state.q.trim() }),
    ...(state.mine ? { mine: true } : state.tuner ? { tuner: state.tuner } : {}),
    ...(state.dealer && { dealer: state.dealer }),
    ...(state.package && { package: state.package }),
    ...(state.customer && { customer: state.customer }),
    ...(state.awaitingApproval && { awaitingApproval: true }),
  };
}

/** The board asks for every open job at once (a shop's open work fits one page), oldest move first. */
export const BOARD_PAGE_SIZE = 200;
export function boardParams(state: JobsScreenState): JobListParams {
  return { ...filterParams(state), open: true, sort: 'state_changed', dir: 'asc', pageSize: BOARD_PAGE_SIZE };
}

/** The table pages, sorts and filters on the server. */
export function tableParams(state: JobsScreenState): JobListParams {
  return {
    ...filterParams(state),
    ...(state.state === 'open' ? { open: true } : state.state ? { state: [state.state] } : {}),
    sort: state.sort,
    dir: state.dir,
    page: state.page,
    pageSize: state.pageSize,
  };
}

