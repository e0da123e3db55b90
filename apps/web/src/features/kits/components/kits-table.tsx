import type { Kit } from '@revloop/contract';
import { formatMoney } from '@revloop/domain/billing';
import { KIT_STATUS_LABELS } from '@revloop/domain/rentals';
import { Badge } from '../../../components/ui/badge';
import { ScrollRegion } from '../../../components/ui/scroll-region';
import { TextLink } from '../../../components/ui/text-link';
import { paths } from '../../../config/paths';

/** The column headings of the kit tables. */
export function KitTableHead({ columns }: { columns: string[] }) {
  return (
    <thead className="bg-ink-50 text-xs uppercase text-ink-600">
      <tr>
        {columns.map((h) => (
          <th key={h} scope="col" className="px-4 py-2 font-medium">
            {h}
          </th>
        ))}
      </tr>
    </thead>
  );
}

/** The shop's kits: what each is, where it is and what it costs to rent. Scrolls sideways on a phone. */
export function KitsTable({ kits }: { kits: Kit[] }) {
  return (
    <ScrollRegion label="Kits">
      <table className="w-full min-w-[52rem] text-left text-sm">
        <caption className="sr-only">Flashing kits: serials, status and rental prices</caption>
        <KitTableHead columns={['Name', 'Interface serial', 'Laptop asset tag', 'Status', 'Per week', 'Deposit', 'Late fee / day']} />
        <tbody className="divide-y divide-ink-100">
          {kits.map((kit) => (
            <tr key={kit.id}>
              <th scope="row" className="px-4 py-3 font-medium">
                <TextLink to={paths.kits.detail.getHref(kit.id)}>{kit.name}</TextLink>
              </th>
              <td className="px-4 py-3 font-mono">{kit.interfaceSerial}</td>
              <td className="px-4 py-3 font-mono">{kit.laptopAssetTag || '—'}</td>
              <td className="px-4 py-3">
                <Badge tone={kit.status === 'available' ? 'ok' : kit.status === 'retired' || kit.status === 'in_repair' ? 'bad' : 'neutral'}>{KIT_STATUS_LABELS[kit.status]}</Badge>
              </td>
              <td className="px-4 py-3">{formatMoney(kit.weeklyPriceMinor, kit.currency)}</td>
              <td className="px-4 py-3">{formatMoney(kit.depositMinor, kit.currency)}</td>
              <td className="px-4 py-3">{formatMoney(kit.lateFeePerDayMinor, kit.currency)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </ScrollRegion>
  );
}
