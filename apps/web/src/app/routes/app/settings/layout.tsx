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
  const showShop = canOpen('shopSettings', ability, useSignedInMe());
  return (
    <>
      <PageHeader title="Settings" />
      {showShop && (
        <nav aria-label="Settings" className="mb-6 flex gap-2 border-b border-ink-200">
          <NavLink to={paths.settings.profile.getHref()} className={tabClasses}>
            Profile
          </NavLink>
          <NavLink to={paths.settings.shop.getHref()} className={tabClasses}>
            Shop
          </NavLink>
        </nav>
      )}
      <Outlet />
    </>
  );
}
