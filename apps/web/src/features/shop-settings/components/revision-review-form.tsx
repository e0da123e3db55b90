import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { errorMessage } from '../../../lib/form-errors';
import type { Shop } from '@revloop/contract';
import { useUpdateShop } from '../api/update-shop';

/** Revision review: whether a draft needs a second person's approval (another tuner or the owner) before it is sent. */
export function RevisionReviewForm({ shop, canEdit }: { shop: Shop; canEdit: boolean }) {
  const [approval, setApproval] = useState(shop.revisionApproval);
  const update = useUpdateShop();
  const dirty = approval !== shop.revisionApproval;
  return (
    <form
      className="flex flex-col gap-3"
      onSubmit={(event) => {
        event.preventDefault();
        update.mutate({ revisionApproval: approval });
      }}
    >
      <label className="flex items-start gap-2 text-sm text-ink-800">
        <input type="checkbox" className="mt-1 size-4 accent-accent-600" checked={approval} disabled={!canEdit} onChange={(e) => setApproval(e.target.checked)} />
        <span>
          <span className="font-medium">Ask for a second person’s approval before a revision is sent.</span>
          <span className="block text-ink-600">
            Another tuner or the owner approves each draft; nobody approves their own. Applies to drafts uploaded from now on.
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
            Save revision review
          </Button>
        </div>
      )}
    </form>
  );
}
