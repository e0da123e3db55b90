import { useState } from 'react';
import type { Shop } from '@revloop/contract';
import { Button } from '../../../components/ui/button';
import { errorMessage } from '../../../lib/form-errors';
import { useUpdateShop } from '../api/update-shop';

/** Paid before download: whether a retail customer's sent revisions stay locked until the job is paid. */
export function PaymentLockForm({ shop, canEdit }: { shop: Shop; canEdit: boolean }) {
  const [locked, setLocked] = useState(shop.paidBeforeDownload);
  const update = useUpdateShop();
  const dirty = locked !== shop.paidBeforeDownload;
  return (
    <form
      className="flex flex-col gap-3"
      onSubmit={(event) => {
        event.preventDefault();
        update.mutate({ paidBeforeDownload: locked });
      }}
    >
      <label className="flex items-start gap-2 text-sm text-ink-800">
        <input type="checkbox" className="mt-1 size-4 accent-accent-600" checked={locked} disabled={!canEdit} onChange={(e) => setLocked(e.target.checked)} />
        <span>
          <span className="font-medium">Keep sent revisions locked until the job is paid.</span>
          <span className="block text-ink-600">
            Retail customers see the revision and its note with a Pay button; the download opens once payment lands. Dealers’ jobs are paid from
            the dealer balance and never locked. Reads, re-reads and logs are never locked. You can waive the lock for one job on its page.
          </span>
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
            Save payment before download
          </Button>
        </div>
      )}
    </form>
  );
}
