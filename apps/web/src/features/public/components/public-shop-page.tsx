import { useState } from 'react';
import type { PublicShop } from '@revloop/contract';
import { formatMoney } from '@revloop/domain/billing';
import { Banner } from '../../../components/ui/banner';
import { Button } from '../../../components/ui/button';
import { Card } from '../../../components/ui/card';
import { EmptyState } from '../../../components/ui/empty-state';
import { CautionsList } from '../../jobs/components/cautions';
import { StartTuneForm } from './start-tune-form';

const MODULE_NAMES: Record<string, string> = { ECM: 'Engine (ECM)', TCM: 'Transmission (TCM)' };

/** A shop's public page: who they are, what they sell at retail, and "Start a tune". */
export function PublicShopPage({ shop }: { shop: PublicShop }) {
  const [chosen, setChosen] = useState<string | null>(null);
  const [sentTo, setSentTo] = useState<string | null>(null);
  const choose = (packageId: string) => {
    setChosen(packageId);
    // Let the form render before moving to it.
    requestAnimationFrame(() =>
      document.getElementById('start')?.scrollIntoView({ behavior: 'smooth', block: 'start' }),
    );
  };

  return (
    <div className="flex w-full max-w-5xl flex-col gap-8">
      <header className="flex flex-col gap-2">
        <h1 className="text-2xl font-semibold text-ink-900 sm:text-3xl">{shop.name}</h1>
        {shop.description && <p className="max-w-3xl text-base text-ink-700">{shop.description}</p>}
        <p className="text-sm text-ink-600">
          Remote calibration: you read the control unit, we revise it, you flash it and send a log,
          round after round until it is dialed in.
        </p>
      </header>

      <section aria-labelledby="packages-title" className="flex flex-col gap-4">
        <h2 id="packages-title" className="text-lg font-semibold text-ink-900">
          Packages
        </h2>
        {shop.packages.length === 0 ? (
          <EmptyState title="No packages on offer right now">
            Ask the shop directly, or come back later.
          </EmptyState>
        ) : (
          <ul className="grid gap-4 sm:grid-cols-2 lg:grid-cols-3">
            {shop.packages.map((pkg) => (
              <li
                key={pkg.id}
                className="flex flex-col gap-3 rounded-card border border-ink-200 bg-white p-5 shadow-xs"
              >
                <div className="flex items-baseline justify-between gap-3">
                  <h3 className="text-base font-semibold text-ink-900">{pkg.name}</h3>
                  <p className="text-lg font-semibold text-ink-900 tabular-nums">
                    {formatMoney(pkg.retailPriceMinor, shop.currency)}
                  </p>
                </div>
                {pkg.description && <p className="text-sm text-ink-700">{pkg.description}</p>}
                <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1 text-sm">
                  <dt className="text-ink-600">Covers</dt>
                  <dd className="text-ink-900">
                    {pkg.modules.map((m) => MODULE_NAMES[m] ?? m).join(', ')}
                  </dd>
                  <dt className="text-ink-600">Rounds</dt>
                  <dd className="text-ink-900">{pkg.roundsIncluded} revision rounds included</dd>
                </dl>
                <Button
                  className="mt-auto"
                  variant={chosen === pkg.id ? 'primary' : 'secondary'}
                  onClick={() => choose(pkg.id)}
                  aria-label={`Start a tune: ${pkg.name}`}
                >
                  Start a tune
                </Button>
              </li>
            ))}
          </ul>
        )}
      </section>

      <Card title="Before you start">
        <p className="mb-3 text-sm text-ink-700">
          Tuning changes how the engine and transmission behave. Whatever package you choose:
        </p>
        <CautionsList />
      </Card>

      {sentTo ? (
        <Banner tone="ok" title="Check your e-mail">
          We sent a link to {sentTo}. Open it within a day to confirm your address: your account and
          your job open together, and the job page tells you how to read the stock calibration off
          the vehicle.
        </Banner>
      ) : (
        chosen !== null && (
          <section
            id="start"
            aria-labelledby="start-title"
            className="flex scroll-mt-4 flex-col gap-4"
          >
            <h2 id="start-title" className="text-lg font-semibold text-ink-900">
              Start a tune with {shop.name}
            </h2>
            <StartTuneForm
              slug={shop.slug}
              packages={shop.packages}
              currency={shop.currency}
              packageId={chosen}
              onSent={setSentTo}
            />
          </section>
        )
      )}
    </div>
  );
}
