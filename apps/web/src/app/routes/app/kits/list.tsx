import { useState } from 'react';
import { useAbility } from '@casl/react';
import type { AppAbility } from '@revloop/domain/auth';
import { PageHeader } from '../../../../components/layout/page-header';
import { Banner } from '../../../../components/ui/banner';
import { Button, buttonClasses } from '../../../../components/ui/button';
import { Card } from '../../../../components/ui/card';
import { EmptyState } from '../../../../components/ui/empty-state';
import { PageSpinner } from '../../../../components/ui/spinner';
import { Link } from 'react-router-dom';
import { paths } from '../../../../config/paths';
import { useSignedInMe } from '../../../../features/auth/api/get-me';
import { canOpen } from '../../../../features/auth/components/nav-items';
import { useKits } from '../../../../features/kits/api/get-kits';
import { KitForm } from '../../../../features/kits/components/kit-form';
import { KitsTable } from '../../../../features/kits/components/kits-table';
import { errorMessage } from '../../../../lib/form-errors';
import { RequireScreen } from '../require-screen';

function KitsScreen() {
  const ability = useAbility<AppAbility>();
  const me = useSignedInMe();
  const kits = useKits();
  const [adding, setAdding] = useState(false);
  const canManage = ability.can('create', 'Kit');
  return (
    <>
      <PageHeader
        title="Kits"
        description="Flashing kits the shop rents to remote customers: interface, laptop, cables and battery supporter."
        actions={
          <>
            {canOpen('kitOverview', ability, me) && (
              <Link className={buttonClasses('secondary')} to={paths.kits.overview.getHref()}>
                Kits overview
              </Link>
            )}
            {canManage && !adding && <Button onClick={() => setAdding(true)}>Add kit</Button>}
          </>
        }
      />
      {adding && (
        <Card title="New kit" className="mb-6" actions={<Button variant="ghost" onClick={() => setAdding(false)}>Cancel</Button>}>
          <KitForm currency={me.shop?.currency ?? 'USD'} onDone={() => setAdding(false)} />
        </Card>
      )}
      {kits.isPending ? (
        <PageSpinner label="Loading kits" />
      ) : kits.isError ? (
        <Banner tone="bad">{errorMessage(kits.error)}</Banner>
      ) : kits.data.data.length === 0 ? (
        <EmptyState title="No kits yet">{canManage ? 'Add the first kit the shop rents out.' : 'The owner has not added any kits.'}</EmptyState>
      ) : (
        <KitsTable kits={kits.data.data} />
      )}
    </>
  );
}

export function KitsRoute() {
  return (
    <RequireScreen screen="kits">
      <KitsScreen />
    </RequireScreen>
  );
}
