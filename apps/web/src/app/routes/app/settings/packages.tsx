import { useAbility } from '@casl/react';
import type { AppAbility } from '@revloop/domain/auth';
import { Banner } from '../../../../components/ui/banner';
import { Card } from '../../../../components/ui/card';
import { PageSpinner } from '../../../../components/ui/spinner';
import { usePackages } from '../../../../features/packages/api/get-packages';
import { PackagesList } from '../../../../features/packages/components/packages-list';
import { errorMessage } from '../../../../lib/form-errors';
import { RequireScreen } from '../require-screen';

function PackagesSettings() {
  const ability = useAbility<AppAbility>();
  const packages = usePackages();
  return (
    <Card title="Packages" description="What the shop sells: modules covered, retail and dealer price, and the log rounds included. Intake offers only the packages you offer.">
      {packages.isPending ? (
        <PageSpinner label="Loading packages" />
      ) : packages.isError ? (
        <Banner tone="bad">{errorMessage(packages.error)}</Banner>
      ) : (
        <PackagesList packages={packages.data.data} currency={packages.data.meta.currency} canEdit={ability.can('update', 'Package')} />
      )}
    </Card>
  );
}

export function PackagesSettingsRoute() {
  return (
    <RequireScreen screen="shopSettings">
      <PackagesSettings />
    </RequireScreen>
  );
}
