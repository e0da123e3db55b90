import { useState } from 'react';
import { addDays } from '@revloop/domain/rentals';
import { PageHeader } from '../../../../components/layout/page-header';
import { Banner } from '../../../../components/ui/banner';
import { buttonClasses } from '../../../../components/ui/button';
import { Field } from '../../../../components/ui/field';
import { Input } from '../../../../components/ui/input';
import { PageSpinner } from '../../../../components/ui/spinner';
import { useKitOverview } from '../../../../features/kits/api/get-kit-overview';
import { KitOverviewView } from '../../../../features/kits/components/kit-overview-table';
import { getRentalMoneyExportHref } from '../../../../features/rentals/api/export-rental-money';
import { cn } from '../../../../lib/cn';
import { errorMessage } from '../../../../lib/form-errors';
import { RequireScreen } from '../require-screen';

function KitOverviewScreen() {
  const today = new Date().toISOString().slice(0, 10);
  const [range, setRange] = useState({ from: addDays(today, -90), to: today });
  const valid = range.from <= range.to;
  const overview = useKitOverview(range, { enabled: valid });
  return (
    <>
      <PageHeader title="Kits overview" description="What is out, what is due, and how much each kit earns over the days you choose." />
      <div className="mb-6 flex flex-wrap gap-4">
        <Field id="overview-from" label="From" error={valid ? undefined : 'The range ends before it starts.'}>
          {(a) => <Input {...a} type="date" value={range.from} onChange={(e) => setRange((r) => ({ ...r, from: e.target.value }))} />}
        </Field>
        <Field id="overview-to" label="To">
          {(a) => <Input {...a} type="date" value={range.to} onChange={(e) => setRange((r) => ({ ...r, to: e.target.value }))} />}
        </Field>
        {valid && (
          <a href={getRentalMoneyExportHref(range)} download className={cn(buttonClasses('secondary', 'sm'), 'self-end')}>
            Export money lines (CSV)
          </a>
        )}
      </div>
      {overview.isPending ? (
        valid && <PageSpinner label="Loading the overview" />
      ) : overview.isError ? (
        <Banner tone="bad">{errorMessage(overview.error)}</Banner>
      ) : (
        <KitOverviewView overview={overview.data.data} />
      )}
    </>
  );
}

export function KitOverviewRoute() {
  return (
    <RequireScreen screen="kitOverview">
      <KitOverviewScreen />
    </RequireScreen>
  );
}
