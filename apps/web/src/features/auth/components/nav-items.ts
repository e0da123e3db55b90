import type { Me } from '@revloop/contract';
import type { AppAbility } from '@revloop/domain/auth';
import { paths } from '../../../config/paths';

type Viewer = Pick<Me, 'role'>;

/**
 * Who may open each signed-in screen: the ability decides, and where several roles may read the same rows,
 * the role picks whose view the screen is (the owner's dealer list, the dealer's customers, the customer's vehicles).
 */
export const screenAccess = {
  shops: (ability: AppAbility) => ability.can('manage', 'Platform'),
  jobs: (ability: AppAbility) => ability.can('read', 'Job'),
  vehicles: (ability: AppAbility, viewer: Viewer) => viewer.role === 'customer' && ability.can('read', 'Vehicle'),
  customers: (ability: AppAbility, viewer: Viewer) => viewer.role !== 'customer' && ability.can('read', 'Customer'),
  team: (ability: AppAbility) => ability.can('read', 'Member'),
  dealers: (ability: AppAbility, viewer: Viewer) => viewer.role === 'owner' && ability.can('read', 'Dealer'),
  /** One dealer's page: the owner's view of any dealer, a dealer user's own. */
  dealer: (ability: AppAbility, viewer: Viewer) => (viewer.role === 'owner' || viewer.role === 'dealer') && ability.can('read', 'Dealer'),
  shopSettings: (ability: AppAbility) => ability.can('read', 'ShopSettings'),
  revenue: (ability: AppAbility) => ability.can('manage', 'Platform'),
  billing: (ability: AppAbility, viewer: Viewer) => viewer.role === 'owner' && ability.can('read', 'Subscription'),
  statement: (ability: AppAbility, viewer: Viewer) => viewer.role === 'dealer' && ability.can('read', 'Ledger'),
  mailbox: (ability: AppAbility) => ability.can('read', 'Mailbox'),
  reports: (ability: AppAbility) => ability.can('read', 'Report'),
  // Customers and dealers read kits only to pick dates on a job; the kit pages are the shop's.
  kits: (ability: AppAbility, viewer: Viewer) => (viewer.role === 'owner' || viewer.role === 'tuner') && ability.can('read', 'Kit'),
  kitOverview: (ability: AppAbility, viewer: Viewer) => viewer.role === 'owner' && ability.can('update', 'Kit'),
} satisfies Record<string, (ability: AppAbility, viewer: Viewer) => boolean>;

export type Screen = keyof typeof screenAccess;

export const canOpen = (screen: Screen, ability: AppAbility, viewer: Viewer): boolean => screenAccess[screen](ability, viewer);

export interface NavItem {
  label: string;
  to: string;
}

const NAV: Array<{ screen: Screen; label: (viewer: Viewer) => string; to: string }> = [
  { screen: 'shops', label: () => 'Shops', to: paths.admin.shops.getHref() },
  { screen: 'revenue', label: () => 'Revenue', to: paths.admin.revenue.getHref() },
  { screen: 'jobs', label: (viewer) => (viewer.role === 'customer' ? 'My jobs' : 'Jobs'), to: paths.jobs.getHref() },
  { screen: 'vehicles', label: () => 'Vehicles', to: paths.vehicles.getHref() },
  { screen: 'customers', label: () => 'Customers', to: paths.customers.getHref() },
  { screen: 'team', label: () => 'Team', to: paths.team.getHref() },
  { screen: 'dealers', label: () => 'Dealers', to: paths.dealers.list.getHref() },
  { screen: 'statement', label: () => 'Statement', to: paths.billing.myStatement.getHref() },
  { screen: 'reports', label: () => 'Reports', to: paths.reports.getHref() },
  { screen: 'kits', label: () => 'Kits', to: paths.kits.list.getHref() },
  { screen: 'billing', label: () => 'Billing', to: paths.billing.shop.getHref() },
  { screen: 'shopSettings', label: () => 'Settings', to: paths.settings.shop.getHref() },
];

/** The main navigation for a user: one link per screen they may open. */
export function navItemsFor(ability: AppAbility, viewer: Viewer): NavItem[] {
  return NAV.filter((item) => canOpen(item.screen, ability, viewer)).map((item) => ({ label: item.label(viewer), to: item.to }));
}

/** Where `/` sends a signed-in user. */
export function homePathFor(ability: AppAbility, viewer: Viewer): string {
  if (canOpen('shops', ability, viewer)) return paths.admin.shops.getHref();
  if (canOpen('jobs', ability, viewer)) return paths.jobs.getHref();
  return paths.settings.profile.getHref();
}
