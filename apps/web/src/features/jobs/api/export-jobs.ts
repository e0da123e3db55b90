import { jobListSearch, type JobListParams } from './get-jobs';

/** The CSV of every job matching the filters (not just the page on screen); the browser downloads it. */
export function getJobsExportHref(params: JobListParams): string {
  const { page: _page, pageSize: _pageSize, ...filters } = params;
  const search = jobListSearch(filters);
  return search ? `/api/jobs/export.csv?${search}` : '/api/jobs/export.csv';
}
