import { Link } from 'react-router-dom';
import type { ShopSetupItem } from '@revloop/contract';
import { Card } from '../../../components/ui/card';
import { paths } from '../../../config/paths';
import { useShopSetup } from '../api/get-shop-setup';

const ITEMS: Record<ShopSetupItem, { label: string; hint: string; to: string; link: string }> = {
  package: {
    label: 'Add a package',
    hint: 'What you sell: modules covered, retail and dealer price, rounds included.',
    to: paths.settings.packages.getHref(),
    link: 'Packages',
  },
  log_requests: {
    label: 'Set the log-request defaults',
    hint: 'The channels, warm-up and full-throttle gears you ask for, per engine family.',
    to: paths.settings.shop.getHref(),
    link: 'Shop settings',
  },
  tuner: {
    label: 'Invite a tuner',
    hint: 'Someone to revise calibrations (you can tune yourself too).',
    to: paths.team.getHref(),
    link: 'Team',
  },
  plan: {
    label: 'Choose a plan',
    hint: 'Your trial ends on its own; pick the plan and seats that fit.',
    to: paths.billing.shop.getHref(),
    link: 'Billing',
  },
  public_page: {
    label: 'Share the public page link',
    hint: 'Choose its address, turn it on, and send the link to customers.',
    to: paths.settings.shop.getHref(),
    link: 'Shop settings',
  },
};

/** The first-run checklist on a new shop's board: gone once every item is done (each ticks itself from the shop's data). */
export function SetupChecklist() {
  const setup = useShopSetup(true);
  if (!setup.isSuccess || setup.data.data.done) return null;
  const { items, slug } = setup.data.data;
  const left = items.filter((i) => !i.done).length;
  const publicUrl = slug ? `${window.location.origin}${paths.publicShop.getHref(slug)}` : null;
  return (
    <Card
      title="Set up your shop"
      description={`${items.length - left} of ${items.length} done. Each step ticks itself when it is done.`}
      className="mb-6"
    >
      <ol className="flex flex-col divide-y divide-ink-100" aria-label="Setup steps">
        {items.map((item) => {
          const info = ITEMS[item.id];
          return (
            <li
              key={item.id}
              className="flex flex-wrap items-start gap-3 py-3 first:pt-0 last:pb-0"
            >
              <span
                aria-hidden
                className={
                  item.done
                    ? 'mt-0.5 grid size-5 shrink-0 place-items-center rounded-full bg-ok text-xs text-white'
                    : 'mt-0.5 size-5 shrink-0 rounded-full border-2 border-ink-300'
                }
              >
                {item.done ? '✓' : ''}
              </span>
              <div className="min-w-0 flex-1">
                <p
                  className={
                    item.done
                      ? 'text-sm font-medium text-ink-600 line-through'
                      : 'text-sm font-medium text-ink-900'
                  }
                >
                  {info.label}
                  <span className="sr-only">{item.done ? ' (done)' : ' (to do)'}</span>
                </p>
                <p className="text-sm text-ink-600">{info.hint}</p>
                {item.id === 'public_page' && item.done && publicUrl && (
                  <p className="mt-1 text-sm break-all">
                    Your page:{' '}
                    <a className="font-medium text-accent-700 underline" href={publicUrl}>
                      {publicUrl}
                    </a>
                  </p>
                )}
              </div>
              {!item.done && (
                <Link
                  to={info.to}
                  className="text-sm font-medium text-accent-700 underline underline-offset-2"
                >
                  {info.link}
                  <span className="sr-only">: {info.label}</span>
                </Link>
              )}
            </li>
          );
        })}
      </ol>
    </Card>
  );
}
