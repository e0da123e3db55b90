import { useState, type ReactNode } from 'react';
import type { Shop } from '@revloop/contract';
import { Button } from '../../../components/ui/button';
import { errorMessage } from '../../../lib/form-errors';
import { useUpdateShop } from '../api/update-shop';

/** The shop's on/off settings, each saved on its own through PATCH /api/shop. */
export type ShopSwitch = 'revisionApproval' | 'paidBeforeDownload';

/** One on/off shop setting: a checkbox with what it means, and a save button for the owner. */
export function ShopSwitchForm({ shop, canEdit, setting, label, children, saveLabel }: { shop: Shop; canEdit: boolean; setting: ShopSwitch; label: string; children: ReactNode; saveLabel: string }) {
  const [on, setOn] = useState(shop[setting]);
  const update = useUpdateShop();
  const dirty = on !== shop[setting];
  return (
    <form
      className="flex flex-col gap-3"
      onSubmit={(event) => {
        event.preventDefault();
        update.mutate({ [setting]: on });
      }}
    >
      <label className="flex items-start gap-2 text-sm text-ink-800">
        <input type="checkbox" className="mt-1 size-4 accent-accent-600" checked={on} disabled={!canEdit} onChange={(e) => setOn(e.target.checked)} />
        <span>
          <span className="font-medium">{label}</span>
          <span className="block text-ink-600">{children}</span>
        </span>
      </label>
      {update.isError && (
        <p role="alert" className="text-sm text-bad">
          {errorMessage(update.error)}
        </p>
      )}
      {canEdit && (
        <div>
          <Button type="submit" pending={update.isPending} disabled={!dirty}>
            {saveLabel}
          </Button>
        </div>
      )}
    </form>
  );
}
