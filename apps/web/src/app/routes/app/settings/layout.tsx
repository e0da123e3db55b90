import { NavLink, Outlet } from 'react-router-dom';
import { useAbility } from '@casl/react';
import type { AppAbility } from '@revloop/domain/auth';
import { PageHeader } from '../../../../components/layout/page-header';
import { paths } from '../../../../config/paths';
import { cn } from '../../../../lib/cn';
import { useSignedInMe } from '../../../../features/auth/api/get-me';
import { canOpen } from '../../../../features/auth/components/nav-items';

const tabClasses = ({ isActive }: { isActive: boolean }) =>
  cn('-mb-px border-b-2 px-3 py-2 text-sm font-medium', isActive ? 'border-accent-600 text-accent-800' : 'border-transparent text-ink-600 hover:text-ink-900');

export function SettingsLayout() {
  const ability = useAbility<AppAbility>();
  const me = useSignedInMe();
  const showShop = canOpen('shopSettings', ability, me);
  const showNotifications = me.shop !== null;
  if (!showShop && !showNotifications) {
    return (
      <>
        <PageHeader title="Settings" />
        <Outlet />
      </>
    );
  }
  return (
    <>
      <PageHeader title="Settings" />
      <nav aria-label="Settings" className="mb-6 flex gap-2 overflow-x-auto border-b border-ink-200">
        <NavLink to={paths.settings.profile.getHref()} className={tabClasses}>
          Profile
        </NavLink>
        {showNotifications && (
          <NavLink to={paths.settings.notifications.getHref()} className={tabClasses}>
            Notifications
          </NavLink>
        )}
        {showShop && (
          <>
            <NavLink to={paths.settings.shop.getHref()} className={tabClasses}>
              Shop
            </NavLink>
            <NavLink to={paths.settings.packages.getHref()} className={tabClasses}>
              Packages
            </NavLink>
          </>
        )}
      </nav>
      <Outlet />
    </>
  );
}
