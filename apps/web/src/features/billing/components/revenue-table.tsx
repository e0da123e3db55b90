import { useMemo } from 'react';
import type { ShopRevenue } from '@revloop/contract';
import { formatMoney } from '@revloop/domain/billing';
import { Badge, type Tone } from '../../../components/ui/badge';
import { createDataTableColumns, DataTable } from '../../../components/ui/data-table';
import { formatDate } from '../../../lib/format';

const helper = createDataTableColumns<ShopRevenue>();
const TONES: Record<ShopRevenue['status'], Tone> = { trialing: 'accent', active: 'ok', past_due: 'warn', unpaid: 'bad', canceled: 'neutral', incomplete: 'warn' };

/** Every shop with its plan, subscription status and what it brings in each month. */
export function RevenueTable({ shops, currency }: { shops: ShopRevenue[]; currency: string }) {
  const columns = useMemo(
    () =>
      helper.columns([
        helper.accessor('shopName', { header: 'Shop', sortFn: 'text', cell: (info) => <span className="font-medium text-ink-900">{info.getValue()}</span> }),
        helper.accessor('planName', { header: 'Plan', sortFn: 'text', cell: (info) => `${info.getValue()} · ${info.row.original.seats} seats` }),
        helper.accessor('statusLabel', {
          header: 'Status',
          sortFn: 'text',
          cell: (info) => {
            const s = info.row.original;
            return (
              <span className="flex flex-wrap gap-1">
                <Badge tone={TONES[s.status]}>{s.statusLabel}</Badge>
                {s.readOnlyReason && <Badge tone="bad">Read-only</Badge>}
                {s.shopStatus === 'suspended' && <Badge tone="warn">Suspended</Badge>}
              </span>
            );
          },
        }),
        helper.accessor((s) => s.trialEndsAt ?? s.currentPeriodEnd ?? '', {
          id: 'next',
          header: 'Trial ends / renews',
          sortFn: 'text',
          cell: (info) => formatDate(info.getValue() || null),
        }),
        helper.accessor('mrrMinor', { header: 'MRR', sortFn: 'basic', cell: (info) => <span className="tabular-nums">{formatMoney(info.getValue(), currency)}</span> }),
      ]),
    [currency],
  );
  return <DataTable caption="Shops and their subscriptions" columns={columns} data={shops} getRowId={(s) => s.shopId} initialSorting={[{ id: 'mrrMinor', desc: true }]} emptyMessage="No shops yet." />;
}
