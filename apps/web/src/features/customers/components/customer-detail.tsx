import { Link } from 'react-router-dom';
import type { CustomerDetail } from '@revloop/contract';
import { formatMoney } from '@revloop/domain/billing';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { PageSpinner } from '../../../components/ui/spinner';
import { textLinkClasses } from '../../../components/ui/text-link';
import { paths } from '../../../config/paths';
import { formatDate, formatDateTime } from '../../../lib/format';
import { useJobs } from '../../jobs/api/get-jobs';

export function CustomerContactCard({ customer }: { customer: CustomerDetail }) {
  return (
    <Card title="Contact" className="self-start">
      <dl className="grid grid-cols-[auto_1fr] gap-x-4 gap-y-2 text-sm">
        <dt className="text-ink-600">E-mail</dt>
        <dd className="break-all text-ink-900">
          <a className={textLinkClasses} href={`mailto:${customer.email}`}>
            {customer.email}
          </a>
        </dd>
        <dt className="text-ink-600">Dealer</dt>
        <dd className="text-ink-900">{customer.dealer?.name ?? 'Direct customer'}</dd>
        <dt className="text-ink-600">Since</dt>
        <dd className="text-ink-900">{formatDate(customer.since)}</dd>
        <dt className="text-ink-600">Paid</dt>
        <dd className="text-ink-900 tabular-nums">{formatMoney(customer.paidMinor, customer.currency)}</dd>
      </dl>
    </Card>
  );
}

export function CustomerVehiclesCard({ customer }: { customer: CustomerDetail }) {
  return (
    <Card title="Vehicles" description="Open a vehicle for its history: reads, revisions, logs and flashes.">
      {customer.vehicles.length === 0 ? (
        <EmptyState title="No vehicles yet">A vehicle is added when you open a job for this customer.</EmptyState>
      ) : (
        <ul className="flex flex-col divide-y divide-ink-100">
          {customer.vehicles.map((v) => (
            <li key={v.id} className="py-2">
              <Link to={paths.vehicle.getHref(v.id)} className={textLinkClasses}>
                {v.description}
              </Link>
              <p className="font-mono text-xs text-ink-600">
                {v.vin} · {v.modelYear} · {v.engineFamily}
              </p>
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}

export function CustomerJobsCard({ customer }: { customer: CustomerDetail }) {
  const jobs = useJobs({ customer: customer.id, sort: 'updated', dir: 'desc', pageSize: 50 });
  return (
    <Card
      title="Jobs"
      actions={
        <Link to={paths.newJob.getHref(customer.id)} className={textLinkClasses}>
          Open a job
        </Link>
      }
    >
      {jobs.isPending ? (
        <PageSpinner label="Loading jobs" />
      ) : !jobs.data?.data.length ? (
        <EmptyState title="No jobs yet">Open a job for this customer to start a calibration.</EmptyState>
      ) : (
        <ul className="flex flex-col divide-y divide-ink-100">
          {jobs.data.data.map((job) => (
            <li key={job.id} className="flex flex-wrap items-baseline justify-between gap-2 py-2 text-sm">
              <Link to={paths.job.getHref(job.id)} className={textLinkClasses}>
                #{job.number} · {job.vehicle.description}
              </Link>
              <span className="text-ink-700">
                {job.stateLabel} · {job.package.name} · updated {formatDate(job.updatedAt)}
              </span>
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}

export function CustomerPaymentsCard({ customer }: { customer: CustomerDetail }) {
  return (
    <Card title="Payments">
      {customer.payments.length === 0 ? (
        <EmptyState title="No payments yet">Payments appear here when the customer pays for a job by card.</EmptyState>
      ) : (
        <div className="overflow-x-auto">
          <table className="w-full min-w-[28rem] text-left text-sm">
            <caption className="sr-only">Payments of {customer.name}</caption>
            <thead className="text-xs tracking-wide text-ink-600 uppercase">
              <tr>
                <th scope="col" className="py-2 pr-3 font-medium">Job</th>
                <th scope="col" className="py-2 pr-3 font-medium">Status</th>
                <th scope="col" className="py-2 pr-3 font-medium">Paid on</th>
                <th scope="col" className="py-2 text-right font-medium">Amount</th>
              </tr>
            </thead>
            <tbody>
              {customer.payments.map((p) => (
                <tr key={p.id} className="border-t border-ink-100">
                  <td className="py-2 pr-3">
                    <Link to={paths.job.getHref(p.jobId)} className={textLinkClasses}>
                      #{p.jobNumber}
                    </Link>
                  </td>
                  <td className="py-2 pr-3">{p.status === 'paid' ? (p.refundedMinor > 0 ? `Paid, ${formatMoney(p.refundedMinor, p.currency)} refunded` : 'Paid') : p.status === 'open' ? 'Not completed' : 'Expired'}</td>
                  <td className="py-2 pr-3">{formatDate(p.paidAt)}</td>
                  <td className="py-2 text-right tabular-nums">{formatMoney(p.amountMinor, p.currency)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </Card>
  );
}

export function CustomerMessagesCard({ customer }: { customer: CustomerDetail }) {
  return (
    <Card title="Messages" description="The latest messages on this customer's jobs.">
      {customer.messages.length === 0 ? (
        <EmptyState title="No messages yet">Write to the customer from one of their jobs.</EmptyState>
      ) : (
        <ol className="flex flex-col gap-3">
          {customer.messages.map((m) => (
            <li key={m.id} className="rounded-lg border border-ink-100 p-3 text-sm">
              <p className="text-xs text-ink-600">
                {m.author.name} on{' '}
                <Link to={paths.job.getHref(m.jobId)} className={textLinkClasses}>
                  job #{m.jobNumber}
                </Link>{' '}
                · {formatDateTime(m.createdAt)}
              </p>
              <p className="mt-1 whitespace-pre-wrap text-ink-900">{m.body}</p>
            </li>
          ))}
        </ol>
      )}
    </Card>
  );
}
