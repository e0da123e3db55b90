import { Link } from 'react-router-dom';
import { EmptyState } from '../../../components/ui/empty-state';
import { PageSpinner } from '../../../components/ui/spinner';
import { textLinkClasses } from '../../../components/ui/text-link';
import { paths } from '../../../config/paths';
import { formatDate } from '../../../lib/format';
import { useJobs } from '../../jobs/api/get-jobs';

/** The dealer's latest jobs, newest activity first; the Jobs screen filters and pages all of them. */
export function DealerJobs({ dealerId }: { dealerId: string }) {
  const jobs = useJobs({ dealer: dealerId, sort: 'updated', dir: 'desc', pageSize: 10 });
  if (jobs.isPending) return <PageSpinner label="Loading jobs" />;
  const rows = jobs.data?.data ?? [];
  if (rows.length === 0) return <EmptyState title="No jobs yet">Jobs appear here when the dealer opens one for a customer.</EmptyState>;
  return (
    <ul className="flex flex-col divide-y divide-ink-100" aria-label="Dealer jobs">
      {rows.map((job) => (
        <li key={job.id} className="flex flex-wrap items-baseline justify-between gap-2 py-2 text-sm">
          <Link to={paths.job.getHref(job.id)} className={textLinkClasses}>
            #{job.number} · {job.vehicle.description}
          </Link>
          <span className="text-ink-700">
            {job.customer.name} · {job.stateLabel} · {formatDate(job.updatedAt)}
          </span>
        </li>
      ))}
    </ul>
  );
}
