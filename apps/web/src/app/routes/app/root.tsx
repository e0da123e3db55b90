import { Navigate, Outlet, useLocation, useMatches } from 'react-router-dom';
import { useAbility } from '@casl/react';
import type { Me } from '@revloop/contract';
import type { AppAbility } from '@revloop/domain/auth';
import { AppShell } from '../../../components/layout/app-shell';
import { PublicFrame } from '../../../components/layout/public-frame';
import { Badge } from '../../../components/ui/badge';
import { Banner } from '../../../components/ui/banner';
import { Button } from '../../../components/ui/button';
import { PageSpinner } from '../../../components/ui/spinner';
import { paths } from '../../../config/paths';
import { useMe } from '../../../features/auth/api/get-me';
import { navItemsFor } from '../../../features/auth/components/nav-items';
import { UserMenu } from '../../../features/auth/components/user-menu';
import { MailboxLink } from '../../../features/mailbox/components/mailbox-link';
import { NotificationBell } from '../../../features/notifications/components/notification-bell';
import { errorMessage } from '../../../lib/form-errors';

function ShopContext({ me }: { me: Me }) {
  if (me.platformAdmin) return <span className="font-medium text-ink-800">Platform administration</span>;
  if (!me.shop) return null;
  return (
    <span className="inline-flex items-center gap-2">
      <span className="truncate font-medium text-ink-800">{me.shop.name}</span>
      {me.dealer && <span className="truncate text-ink-600">· {me.dealer.name}</span>}
      {me.shop.status === 'suspended' && <Badge tone="warn">Suspended</Badge>}
    </span>
  );
}

function ReadOnlyBanner({ me }: { me: Me }) {
  if (!me.shop?.readOnly) return null;
  if (me.shop.status === 'suspended') {
    return (
      <Banner tone="warn" title="This shop is suspended: you can read and download, but not change anything.">
        The owner can contact the platform to reactivate it.
      </Banner>
    );
  }
  return (
    <Banner tone="warn" title="This shop is read-only: you can read and download, but not change anything.">
      {me.shop.readOnlyReason ?? 'The owner can settle the subscription to restore it.'}
    </Banner>
  );
}

/** The signed-in part of the app: sends signed-out visitors to sign in, then draws the shell. */
export function AppRoot() {
  const me = useMe();
  const ability = useAbility<AppAbility>();
  const location = useLocation();
  const unknownPath = useMatches().some((match) => match.id === 'not-found');

  if (me.isPending) return <PageSpinner label="Loading your account" />;
  if (me.isError) {
    return (
      <div className="mx-auto max-w-lg px-4 py-16">
        <Banner tone="bad" title="Your account could not be loaded">
          <p>{errorMessage(me.error)}</p>
          <Button className="mt-3" variant="secondary" onClick={() => void me.refetch()}>
            Try again
          </Button>
        </Banner>
      </div>
    );
  }
  if (!me.data && unknownPath) {
    return (
      <PublicFrame>
        <Outlet />
      </PublicFrame>
    );
  }
  if (!me.data) return <Navigate to={paths.auth.signIn.getHref(location.pathname === '/' ? null : location.pathname + location.search)} replace />;

  return (
    <AppShell
      nav={navItemsFor(ability, me.data)}
      context={<ShopContext me={me.data} />}
      userMenu={<UserMenu me={me.data} />}
      notifications={me.data.shop && <NotificationBell />}
      banner={<ReadOnlyBanner me={me.data} />}
      footer={<MailboxLink />}
    >
      <Outlet />
    </AppShell>
  );
}
