import { Link, useSearchParams } from 'react-router-dom';
import type { Job } from '@revloop/contract';
import { Banner } from '../../../components/ui/banner';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { Field } from '../../../components/ui/field';
import { Select } from '../../../components/ui/select';
import { PageSpinner } from '../../../components/ui/spinner';
import { textLinkClasses } from '../../../components/ui/text-link';
import { paths } from '../../../config/paths';
import { errorMessage } from '../../../lib/form-errors';
import { useCustomers } from '../../customers/api/get-customers';
import { useVehicles } from '../../vehicles/api/get-vehicles';
import { useJobs } from '../api/get-jobs';
import { CautionsList } from './cautions';
import { JobProgressCard } from './job-progress';

const PORTAL_PAGE_SIZE = 100;

function JobList({ jobs, showCustomer, empty }: { jobs: Job[]; showCustomer: boolean; empty: string }) {
  const open = jobs.filter((job) => job.state !== 'dialed_in' && job.state !== 'cancelled');
  const closed = jobs.filter((job) => job.state === 'dialed_in' || job.state === 'cancelled');
  if (jobs.length === 0) return <EmptyState title={empty}>Open a job to start: you will be asked for the vehicle, the package and your goals.</EmptyState>;
  return (
    <div className="flex flex-col gap-6">
      <section aria-labelledby="portal-open" className="flex flex-col gap-3">
        <h2 id="portal-open" className="text-lg font-semibold text-ink-900">
          In progress ({open.length})
        </h2>
        {open.length === 0 ? <p className="text-sm text-ink-600">Nothing in progress.</p> : open.map((job) => <JobProgressCard key={job.id} job={job} showCustomer={showCustomer} />)}
      </section>
      {closed.length > 0 && (
        <section aria-labelledby="portal-closed" className="flex flex-col gap-3">
          <h2 id="portal-closed" className="text-lg font-semibold text-ink-900">
            Finished ({closed.length})
          </h2>
          {closed.map((job) => (
            <JobProgressCard key={job.id} job={job} showCustomer={showCustomer} />
          ))}
        </section>
      )}
    </div>
  );
}

/** A customer's own jobs and vehicles, what to do next, and the cautions that always apply. */
export function CustomerPortal() {
  const jobs = useJobs({ sort: 'updated', dir: 'desc', pageSize: PORTAL_PAGE_SIZE });
  const vehicles = useVehicles();
  return (
    <div className="grid gap-6 lg:grid-cols-[1fr_20rem]">
      <div>
        {jobs.isPending ? (
          <PageSpinner label="Loading your jobs" />
        ) : jobs.isError ? (
          <Banner tone="bad">{errorMessage(jobs.error)}</Banner>
        ) : (
          <JobList jobs={jobs.data.data} showCustomer={false} empty="You have no jobs yet" />
        )}
      </div>
      <aside className="flex flex-col gap-4">
        <Card title="My vehicles">
          {vehicles.data?.data.length ? (
            <ul className="flex flex-col gap-2 text-sm">
              {vehicles.data.data.map((vehicle) => (
                <li key={vehicle.id}>
                  <Link to={paths.vehicle.getHref(vehicle.id)} className={textLinkClasses}>
                    {vehicle.description}
                  </Link>
                  <span className="block font-mono text-xs text-ink-600">{vehicle.vin}</span>
                </li>
              ))}
            </ul>
          ) : (
            <p className="text-sm text-ink-600">{vehicles.isPending ? 'Loading…' : 'Your vehicle is added when you open a job.'}</p>
          )}
        </Card>
        <Card title="Before you flash or log">
          <CautionsList />
        </Card>
      </aside>
    </div>
  );
}

/** A dealer's customers' jobs, narrowed to one customer from the address bar (`?customer=`). */
export function DealerPortal() {
  const [search, setSearch] = useSearchParams();
  const customer = search.get('customer') ?? '';
  const customers = useCustomers();
  const jobs = useJobs({ sort: 'updated', dir: 'desc', pageSize: PORTAL_PAGE_SIZE, ...(customer && { customer }) });
  return (
    <div className="flex flex-col gap-4">
      <div className="w-72">
        <Field id="portal-customer" label="Customer">
          {(a11y) => (
            <Select
              {...a11y}
              value={customer}
              onChange={(event) => setSearch(event.target.value ? { customer: event.target.value } : {}, { replace: true })}
              options={[{ value: '', label: 'All my customers' }, ...(customers.data?.data ?? []).map((c) => ({ value: c.id, label: c.name }))]}
            />
          )}
        </Field>
      </div>
      {jobs.isPending ? (
        <PageSpinner label="Loading jobs" />
      ) : jobs.isError ? (
        <Banner tone="bad">{errorMessage(jobs.error)}</Banner>
      ) : (
        <JobList jobs={jobs.data.data} showCustomer empty="No jobs for your customers yet" />
      )}
    </div>
  );
}
