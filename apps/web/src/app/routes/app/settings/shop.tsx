import { Badge } from '../../../../components/ui/badge';
import { Card } from '../../../../components/ui/card';
import { useSignedInMe } from '../../../../features/auth/api/get-me';
import { RequireScreen } from '../require-screen';

function ShopSettings() {
  const me = useSignedInMe();
  const shop = me.shop;
  if (!shop) return null;
  return (
    <Card title="Shop" description="Packages, prices, payments and default log requests get their own settings in a later release.">
      <dl className="grid max-w-lg grid-cols-[auto_1fr] gap-x-6 gap-y-2 text-sm">
        <dt className="text-ink-600">Name</dt>
        <dd className="font-medium text-ink-900">{shop.name}</dd>
        <dt className="text-ink-600">Status</dt>
        <dd>{shop.status === 'active' ? <Badge tone="ok">Active</Badge> : <Badge tone="warn">Suspended</Badge>}</dd>
        <dt className="text-ink-600">Currency</dt>
        <dd className="text-ink-900">{shop.currency}</dd>
      </dl>
    </Card>
  );
}

export function ShopSettingsRoute() {
  return (
    <RequireScreen screen="shopSettings">
      <ShopSettings />
    </RequireScreen>
  );
}
