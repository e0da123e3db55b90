import type { DealerLedger } from '@revloop/contract';
import { formatMoney } from '@revloop/domain/billing';
import { formatDateTime } from '../../../lib/format';
import { ScrollRegion } from '../../../components/ui/scroll-region';

/** The statement: every entry in the order it was written, with the balance after it. */
export function LedgerTable({ ledger }: { ledger: DealerLedger }) {
  const money = (minor: number) => formatMoney(minor, ledger.currency);
  if (ledger.entries.length === 0) return <p className="text-sm text-ink-600">No entries yet. A top-up is the first.</p>;
  return (
    <ScrollRegion label={`Statement of ${ledger.dealer.name}`}>
      <table className="w-full text-left text-sm">
        <caption className="sr-only">Statement of {ledger.dealer.name}</caption>
        <thead className="text-ink-600">
          <tr>
            <th className="py-2 pr-4 font-medium">Date</th>
            <th className="py-2 pr-4 font-medium">Entry</th>
            <th className="py-2 pr-4 font-medium">Job</th>
            <th className="py-2 pr-4 font-medium">Description</th>
            <th className="py-2 pr-4 text-right font-medium">Amount</th>
            <th className="py-2 text-right font-medium">Balance</th>
          </tr>
        </thead>
        <tbody>
          {[...ledger.entries].reverse().map((e) => (
            <tr key={e.id} className="border-t border-ink-100">
              <td className="py-2 pr-4 whitespace-nowrap">{formatDateTime(e.createdAt)}</td>
              <td className="py-2 pr-4">{e.kindLabel}</td>
              <td className="py-2 pr-4">{e.jobNumber ?? '—'}</td>
              <td className="py-2 pr-4">{e.memo}</td>
              <td className={e.amountMinor < 0 ? 'py-2 pr-4 text-right text-bad tabular-nums' : 'py-2 pr-4 text-right text-ok tabular-nums'}>{money(e.amountMinor)}</td>
              <td className="py-2 text-right tabular-nums">{money(e.balanceAfterMinor)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </ScrollRegion>
  );
}
