import { useAbility } from '@casl/react';
import type { AppAbility } from '@revloop/domain/auth';
import { Badge } from '../../../../components/ui/badge';
import { Banner } from '../../../../components/ui/banner';
import { Card } from '../../../../components/ui/card';
import { PageSpinner } from '../../../../components/ui/spinner';
import { useShop } from '../../../../features/shop-settings/api/get-shop';
import { PublicPageForm } from '../../../../features/shop-settings/components/public-page-form';
import { ShopSwitchForm } from '../../../../features/shop-settings/components/shop-switch-form';
import { ShopSettingsForm } from '../../../../features/shop-settings/components/shop-settings-form';
import { errorMessage } from '../../../../lib/form-errors';
import { RequireScreen } from '../require-screen';

function ShopSettings() {
  const ability = useAbility<AppAbility>();
  const shop = useShop();
  if (shop.isPending) return <PageSpinner label="Loading shop settings" />;
  if (shop.isError) return <Banner tone="bad">{errorMessage(shop.error)}</Banner>;
  const data = shop.data.data;
  const canEdit = ability.can('update', 'ShopSettings');
  return (
    <div className="flex flex-col gap-6">
      <Card
        title="Shop"
        description={
          <span className="inline-flex flex-wrap items-center gap-2">
            {data.status === 'active' ? (
              <Badge tone="ok">Active</Badge>
            ) : (
              <Badge tone="warn">Suspended</Badge>
            )}
            <span>Prices in {data.currency}.</span>
          </span>
        }
      >
        <ShopSettingsForm shop={data} canEdit={canEdit} />
      </Card>
      <Card
        title="Public page"
        description="A page anyone can open: your packages at retail prices and a Start a tune button."
      >
        <PublicPageForm shop={data} canEdit={canEdit} />
      </Card>
      <Card title="Revision review" description="Revisions are drafts until someone sends them with a note of what changed.">
        <ShopSwitchForm shop={data} canEdit={canEdit} setting="revisionApproval" label="Ask for a second person’s approval before a revision is sent." saveLabel="Save revision review">
          Another tuner or the owner approves each draft; nobody approves their own. Applies to drafts uploaded from now on.
        </ShopSwitchForm>
      </Card>
      <Card title="Payment before download" description="A revision a retail customer has not paid for waits for the payment.">
        <ShopSwitchForm shop={data} canEdit={canEdit} setting="paidBeforeDownload" label="Keep sent revisions locked until the job is paid." saveLabel="Save payment before download">
          Retail customers see the revision and its note with a Pay button; the download opens once payment lands. Dealers’ jobs are paid from the
          dealer balance and never locked. Reads, re-reads and logs are never locked. You can waive the lock for one job on its page.
        </ShopSwitchForm>
      </Card>
    </div>
  );
}

export function ShopSettingsRoute() {
  return (
    <RequireScreen screen="shopSettings">
      <ShopSettings />
    </RequireScreen>
  );
}
