import { useState } from 'react';
import { useNavigate } from 'react-router-dom';
import { useAbility } from '@casl/react';
import type { AppAbility } from '@revloop/domain/auth';
import { PageHeader } from '../../../../components/layout/page-header';
import { Banner } from '../../../../components/ui/banner';
import { Button } from '../../../../components/ui/button';
import { Dialog } from '../../../../components/ui/dialog';
import { PageSpinner } from '../../../../components/ui/spinner';
import { paths } from '../../../../config/paths';
import { useDealers } from '../../../../features/dealers/api/get-dealers';
import { CreateDealerForm } from '../../../../features/dealers/components/create-dealer-form';
import { DealersTable } from '../../../../features/dealers/components/dealers-table';
import { errorMessage } from '../../../../lib/form-errors';
import { RequireScreen } from '../require-screen';

function DealersScreen() {
  const ability = useAbility<AppAbility>();
  const dealers = useDealers();
  const navigate = useNavigate();
  const [creating, setCreating] = useState(false);

  return (
    <>
      <PageHeader
        title="Dealers"
        description="Garages that resell your tunes to their own customers at the dealer price."
        actions={ability.can('create', 'Dealer') && <Button onClick={() => setCreating(true)}>New dealer</Button>}
      />
      {dealers.isPending ? (
        <PageSpinner label="Loading dealers" />
      ) : dealers.isError ? (
        <Banner tone="bad">{errorMessage(dealers.error)}</Banner>
      ) : (
        <DealersTable dealers={dealers.data.data} />
      )}
      <Dialog open={creating} title="New dealer" onClose={() => setCreating(false)}>
        <CreateDealerForm
          onCancel={() => setCreating(false)}
          onDone={(dealer) => {
            setCreating(false);
            navigate(paths.dealers.detail.getHref(dealer.id));
          }}
        />
      </Dialog>
    </>
  );
}

export function DealersRoute() {
  return (
    <RequireScreen screen="dealers">
      <DealersScreen />
    </RequireScreen>
  );
}
