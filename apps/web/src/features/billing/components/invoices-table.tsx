import type { SubscriptionInvoice } from '@revloop/contract';
import { formatMoney } from '@revloop/domain/billing';
import { Badge } from '../../../components/ui/badge';
import { formatDate } from '../../../lib/format';
import { ScrollRegion } from '../../../components/ui/scroll-region';

const REASONS: Record<string, string> = { subscription_create: 'First invoice', subscription_cycle: 'Renewal', subscription_update: 'Plan change' };

export function InvoicesTable({ invoices }: { invoices: SubscriptionInvoice[] }) {
  if (invoices.length === 0) return <p className="text-sm text-ink-600">No invoices yet: they appear here once a plan is paid through Checkout.</p>;
  return (
    <ScrollRegion label="Invoices">
      <table className="w-full text-left text-sm">
        <caption className="sr-only">Invoices</caption>
        <thead className="text-ink-600">
          <tr>
            <th className="py-2 pr-4 font-medium">Date</th>
            <th className="py-2 pr-4 font-medium">For</th>
            <th className="py-2 pr-4 font-medium">Period</th>
            <th className="py-2 pr-4 text-right font-medium">Amount</th>
            <th className="py-2 font-medium">Status</th>
          </tr>
        </thead>
        <tbody>
          {invoices.map((i) => (
            <tr key={i.id} className="border-t border-ink-100">
              <td className="py-2 pr-4">{formatDate(i.createdAt)}</td>
              <td className="py-2 pr-4">{(i.reason && REASONS[i.reason]) ?? 'Invoice'}</td>
              <td className="py-2 pr-4">
                {formatDate(i.periodStart)} – {formatDate(i.periodEnd)}
              </td>
              <td className="py-2 pr-4 text-right tabular-nums">{formatMoney(i.status === 'paid' ? i.amountPaidMinor : i.amountDueMinor, i.currency)}</td>
              <td className="py-2">
                <Badge tone={i.status === 'paid' ? 'ok' : i.status === 'open' ? 'warn' : 'neutral'}>{i.status === 'paid' ? 'Paid' : i.status === 'open' ? 'Due' : i.status}</Badge>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </ScrollRegion>
  );
}
