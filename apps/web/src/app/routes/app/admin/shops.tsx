import { useState } from 'react';
import { useAbility } from '@casl/react';
import type { AppAbility } from '@revloop/domain/auth';
import { PageHeader } from '../../../../components/layout/page-header';
import { Banner } from '../../../../components/ui/banner';
import { Button } from '../../../../components/ui/button';
import { Dialog } from '../../../../components/ui/dialog';
import { PageSpinner } from '../../../../components/ui/spinner';
import { useShops } from '../../../../features/shops/api/get-shops';
import { CreateShopForm } from '../../../../features/shops/components/create-shop-form';
import { ShopsTable } from '../../../../features/shops/components/shops-table';
import { errorMessage } from '../../../../lib/form-errors';
import { RequireScreen } from '../require-screen';

function ShopsScreen() {
  const ability = useAbility<AppAbility>();
  const shops = useShops();
  const [creating, setCreating] = useState(false);
  const [invited, setInvited] = useState<string | null>(null);

  return (
    <>
      <PageHeader
        title="Shops"
        description="Every shop on the platform. A suspended shop can still read and download, but not change anything."
        actions={
          ability.can('create', 'Shop') && (
            <Button
              onClick={() => {
                setInvited(null);
                setCreating(true);
              }}
            >
              New shop
            </Button>
          )
        }
      />
      {invited && (
        <Banner tone="ok" className="mb-4">
          Shop created. An invitation went to {invited}.
        </Banner>
      )}
      {shops.isPending ? (
        <PageSpinner label="Loading shops" />
      ) : shops.isError ? (
        <Banner tone="bad">{errorMessage(shops.error)}</Banner>
      ) : (
        <ShopsTable shops={shops.data.data} canSuspend={ability.can('suspend', 'Shop')} />
      )}
      <Dialog open={creating} title="New shop" onClose={() => setCreating(false)}>
        <CreateShopForm
          onCancel={() => setCreating(false)}
          onDone={(email) => {
            setCreating(false);
            setInvited(email);
          }}
        />
      </Dialog>
    </>
  );
}

export function AdminShopsRoute() {
  return (
    <RequireScreen screen="shops">
      <ShopsScreen />
    </RequireScreen>
  );
}
