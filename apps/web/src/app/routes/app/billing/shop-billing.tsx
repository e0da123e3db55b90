import { useEffect } from 'react';
import { useSearchParams } from 'react-router-dom';
import { useAbility } from '@casl/react';
import { useQueryClient } from '@tanstack/react-query';
import type { AppAbility } from '@revloop/domain/auth';
import { formatMoney } from '@revloop/domain/billing';
import { PageHeader } from '../../../../components/layout/page-header';
import { Banner } from '../../../../components/ui/banner';
import { Card } from '../../../../components/ui/card';
import { EmptyState } from '../../../../components/ui/empty-state';
import { PageSpinner } from '../../../../components/ui/spinner';
import { TextLink } from '../../../../components/ui/text-link';
import { paths } from '../../../../config/paths';
import { getMeQueryOptions } from '../../../../features/auth/api/get-me';
import { useDealerBalances } from '../../../../features/billing/api/get-dealer-balances';
import { getSubscriptionQueryOptions, useSubscription } from '../../../../features/billing/api/get-subscription';
import { InvoicesTable } from '../../../../features/billing/components/invoices-table';
import { PlanPicker } from '../../../../features/billing/components/plan-picker';
import { SubscriptionSummary } from '../../../../features/billing/components/subscription-summary';
import { errorMessage } from '../../../../lib/form-errors';

/** Back from Checkout the webhook may land a moment later: look again for a few seconds. */
function useRefreshAfterCheckout(returned: boolean) {
  const queryClient = useQueryClient();
  useEffect(() => {
    if (!returned) return;
    const refresh = () => {
      void queryClient.invalidateQueries({ queryKey: getSubscriptionQueryOptions().queryKey });
      void queryClient.invalidateQueries({ queryKey: getMeQueryOptions().queryKey });
    };
    const timers = [800, 2000, 4500].map((ms) => setTimeout(refresh, ms));
    return () => timers.forEach(clearTimeout);
  }, [returned, queryClient]);
}

function DealerBalances() {
  const balances = useDealerBalances();
  if (balances.isPending || balances.isError || balances.data.data.length === 0) return null;
  return (
    <Card title="Dealer balances" description="Prepaid balances that wholesale jobs are paid from.">
      <ul className="flex flex-col gap-2 text-sm">
        {balances.data.data.map((d) => (
          <li key={d.id} className="flex justify-between gap-4">
            <TextLink to={paths.billing.statement.getHref(d.id)}>{d.name}</TextLink>
            <span className="tabular-nums">{formatMoney(d.balanceMinor, d.currency)}</span>
          </li>
        ))}
      </ul>
    </Card>
  );
}

function ShopBillingScreen() {
  const [params] = useSearchParams();
  const returned = params.has('checkout') || params.has('card');
  useRefreshAfterCheckout(returned);
  const subscription = useSubscription();
  if (subscription.isPending) return <PageSpinner label="Loading billing" />;
  if (subscription.isError) {
    return (
      <Banner tone="bad" title="Billing could not be loaded">
        {errorMessage(subscription.error)}
      </Banner>
    );
  }
  const s = subscription.data.data;
  return (
    <>
      <PageHeader title="Billing" description="Your Revloop plan, its seats and job volume, invoices, and the dealers’ prepaid balances." />
      <div className="flex flex-col gap-6">
        {returned && (
          <Banner tone="ok" title={params.has('card') ? 'Card saved' : 'Payment received'}>
            The provider confirms it in a moment; this page updates by itself.
          </Banner>
        )}
        <div className="grid gap-6 lg:grid-cols-[minmax(0,1fr)_minmax(0,20rem)]">
          <SubscriptionSummary subscription={s} />
          <DealerBalances />
        </div>
        <PlanPicker subscription={s} />
        <Card title="Invoices">
          <InvoicesTable invoices={s.invoices} />
        </Card>
      </div>
    </>
  );
}

export function ShopBillingRoute() {
  const ability = useAbility<AppAbility>();
  if (!ability.can('read', 'Subscription') || ability.can('manage', 'Platform')) {
    return <EmptyState title="This page is not part of your role">Only the shop’s owner manages its billing.</EmptyState>;
  }
  return <ShopBillingScreen />;
}
