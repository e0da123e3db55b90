import { useAbility } from '@casl/react';
import type { AppAbility } from '@revloop/domain/auth';
import { formatMoney } from '@revloop/domain/billing';
import { PageHeader } from '../../../../components/layout/page-header';
import { Banner } from '../../../../components/ui/banner';
import { Card } from '../../../../components/ui/card';
import { EmptyState } from '../../../../components/ui/empty-state';
import { PageSpinner } from '../../../../components/ui/spinner';
import { useRevenue } from '../../../../features/billing/api/get-revenue';
import { MrrChart } from '../../../../features/billing/components/mrr-chart';
import { RevenueTable } from '../../../../features/billing/components/revenue-table';
import { errorMessage } from '../../../../lib/form-errors';

function RevenueScreen() {
  const revenue = useRevenue();
  if (revenue.isPending) return <PageSpinner label="Loading revenue" />;
  if (revenue.isError) {
    return (
      <Banner tone="bad" title="Revenue could not be loaded">
        {errorMessage(revenue.error)}
      </Banner>
    );
  }
  const r = revenue.data.data;
  const paying = r.shops.filter((s) => s.mrrMinor > 0).length;
  return (
    <>
      <PageHeader title="Revenue" description="Monthly recurring revenue from shop subscriptions. Trials count nothing until they pay." />
      <div className="flex flex-col gap-6">
        <div className="grid gap-4 sm:grid-cols-3">
          <Card title="MRR">
            <p className="text-2xl font-semibold tabular-nums">{formatMoney(r.mrrMinor, r.currency)}</p>
          </Card>
          <Card title="Paying shops">
            <p className="text-2xl font-semibold tabular-nums">{paying}</p>
          </Card>
          <Card title="Read-only for billing">
            <p className="text-2xl font-semibold tabular-nums">{r.shops.filter((s) => s.readOnlyReason).length}</p>
          </Card>
        </div>
        <Card title="MRR over the last 12 months">
          <MrrChart series={r.series} currency={r.currency} />
        </Card>
        <Card title="Shops">
          <RevenueTable shops={r.shops} currency={r.currency} />
        </Card>
      </div>
    </>
  );
}

export function RevenueRoute() {
  const ability = useAbility<AppAbility>();
  if (!ability.can('manage', 'Platform')) return <EmptyState title="This page is not part of your role">Only platform admins see platform revenue.</EmptyState>;
  return <RevenueScreen />;
}
