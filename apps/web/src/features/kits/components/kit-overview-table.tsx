import type { KitOverview, RentalSummary } from '@revloop/contract';
import { formatMoney } from '@revloop/domain/billing';
import { KIT_STATUS_LABELS } from '@revloop/domain/rentals';
import { Card } from '../../../components/ui/card';
import { ScrollRegion } from '../../../components/ui/scroll-region';
import { TextLink } from '../../../components/ui/text-link';
import { paths } from '../../../config/paths';
import { formatDate } from '../../../lib/format';
import { KitTableHead } from './kits-table';

function RentalList({ title, rentals, empty }: { title: string; rentals: RentalSummary[]; empty: string }) {
  return (
    <Card title={`${title} (${rentals.length})`}>
      {rentals.length === 0 ? (
        <p className="text-sm text-ink-600">{empty}</p>
      ) : (
        <ul className="flex flex-col gap-2 text-sm">
          {rentals.map((r) => (
            <li key={r.id}>
              <TextLink to={paths.job.getHref(r.jobId)}>{r.kitName ?? 'No kit yet'}</TextLink> — {r.customerName}, due {formatDate(r.dueDate)}
              {r.lateDays > 0 && <span className="text-bad"> ({r.lateDays} days late)</span>}
            </li>
          ))}
        </ul>
      )}
    </Card>
  );
}

/** Out now, due this week, overdue, and each kit's utilisation (days out ÷ days in service) and revenue. */
export function KitOverviewView({ overview }: { overview: KitOverview }) {
  return (
    <div className="flex flex-col gap-6">
      <div className="grid gap-4 lg:grid-cols-3">
        <RentalList title="Out now" rentals={overview.outNow} empty="No kit is out." />
        <RentalList title="Due this week" rentals={overview.dueThisWeek} empty="Nothing due in the next 7 days." />
        <RentalList title="Overdue" rentals={overview.overdue} empty="Nothing overdue." />
      </div>
      {/* The explanation wraps to the page, not to the table's width: on a phone the table scrolls sideways, the words do not. */}
      <div className="flex flex-col gap-2">
        <p id="kit-overview-note" className="px-2 text-sm text-ink-600">
          Per kit from {formatDate(overview.from)} to {formatDate(overview.to)}: utilisation is days out ÷ days in service; revenue is rental fees, late fees and deposit captures ({overview.currency}).
        </p>
        <ScrollRegion label="Kits utilisation and revenue">
          <table className="w-full min-w-[40rem] text-left text-sm" aria-describedby="kit-overview-note">
            <caption className="sr-only">
              Utilisation and revenue per kit, {formatDate(overview.from)} to {formatDate(overview.to)}
            </caption>
            <KitTableHead columns={['Kit', 'Status', 'Days out', 'Days in service', 'Utilisation', 'Revenue']} />
            <tbody className="divide-y divide-ink-100">
              {overview.kits.map((k) => (
                <tr key={k.kitId}>
                  <th scope="row" className="px-4 py-3 font-medium">
                    <TextLink to={paths.kits.detail.getHref(k.kitId)}>{k.name}</TextLink>
                  </th>
                  <td className="px-4 py-3">{KIT_STATUS_LABELS[k.status]}</td>
                  <td className="px-4 py-3 tabular-nums">{k.daysOut}</td>
                  <td className="px-4 py-3 tabular-nums">{k.daysInService}</td>
                  <td className="px-4 py-3 tabular-nums">{k.utilisation === null ? '—' : `${(k.utilisation * 100).toFixed(0)} %`}</td>
                  <td className="px-4 py-3 tabular-nums">{formatMoney(k.revenueMinor, overview.currency)}</td>
                </tr>
              ))}
            </tbody>
          </table>
        </ScrollRegion>
      </div>
    </div>
  );
}
