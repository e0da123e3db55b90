import type { AppAbility } from '@revloop/domain/auth';
import { paths } from '../../../config/paths';
import type { Me } from '../api/get-me';

export interface NavItem {
  label: string;
  to: string;
}

/**
 * The main navigation for a user: each link shows only when the ability allows its page.
 * Dealers, Customers and Vehicles are one role's own view of rows others may also read, so they also check the role.
 */
export function navItemsFor(ability: AppAbility, me: Pick<Me, 'role'>): NavItem[] {
  const items: NavItem[] = [];
  if (ability.can('manage', 'Platform')) items.push({ label: 'Shops', to: paths.admin.shops.getHref() });
  if (ability.can('read', 'Job')) items.push({ label: me.role === 'customer' ? 'My jobs' : 'Jobs', to: paths.jobs.getHref() });
  if (me.role === 'customer' && ability.can('read', 'Vehicle')) items.push({ label: 'Vehicles', to: paths.vehicles.getHref() });
  if (me.role === 'dealer' && ability.can('read', 'Customer')) items.push({ label: 'Customers', to: paths.customers.getHref() });
  if (ability.can('read', 'Member')) items.push({ label: 'Team', to: paths.team.getHref() });
  if (me.role === 'owner' && ability.can('read', 'Dealer')) items.push({ label: 'Dealers', to: paths.dealers.list.getHref() });
  if (ability.can('read', 'ShopSettings')) items.push({ label: 'Settings', to: paths.settings.shop.getHref() });
  return items;
}

/** Where `/` sends a signed-in user. */
export function homePathFor(ability: AppAbility): string {
  if (ability.can('manage', 'Platform')) return paths.admin.shops.getHref();
  if (ability.can('read', 'Job')) return paths.jobs.getHref();
  return paths.settings.profile.getHref();
}
