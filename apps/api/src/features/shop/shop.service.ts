import { isSlugTaken, isUniqueViolation, outsideShopScope, updateShop, type ShopRow } from '@revloop/db';
import { DomainError } from '@revloop/domain';
import type { ShopSettings } from '@revloop/domain/shops';
import type { AppDeps } from '../../context';
import type { AuthContext } from '../../http/auth-context';
import { writeWithAudit } from '../audit/audit.service';

export interface ShopChange {
  name?: string;
  settings: ShopSettings;
  slug: string | null;
  publicPage: boolean;
  description?: string;
  /** Revision drafts need a second person's approval before they are sent (applies to drafts uploaded from now on). */
  revisionApproval?: boolean;
  /** A retail customer's sent revisions stay locked until the job is paid (applies at once, to every open job). */
  paidBeforeDownload?: boolean;
}

/** Saves the shop's name, settings and public page, refusing an address another shop uses; audits the change. */
export async function changeShop({ db, clock }: AppDeps, auth: AuthContext & { shop: ShopRow }, change: ShopChange): Promise<ShopRow> {
  const { slug } = change;
  const clash = () => new DomainError('conflict', `Another shop already uses the address /s/${slug}. Choose another.`);
  // Unscoped: whether any other shop uses the address (only yes or no comes back).
  if (slug !== null && slug !== auth.shop.slug && (await outsideShopScope(db, () => isSlugTaken(db, slug, auth.shop.id)))) throw clash();
  return writeWithAudit(
    db,
    async (trx) => {
      const shop = await updateShop(trx, auth.shop.id, {
        ...(change.name && { name: change.name }),
        settings: JSON.stringify(change.settings),
        slug,
        public_page: change.publicPage ? 1 : 0,
        ...(change.description !== undefined && { description: change.description }),
        ...(change.revisionApproval !== undefined && { revision_approval: change.revisionApproval ? 1 : 0 }),
        ...(change.paidBeforeDownload !== undefined && { paid_before_download: change.paidBeforeDownload ? 1 : 0 }),
      }).catch((error: unknown) => {
        // Two owners taking the same address at once: the unique index decides, and the loser hears the same 409.
        if (isUniqueViolation(error, 'slug')) throw clash();
        throw error;
      });
      if (!shop) throw new DomainError('not_found', 'Shop not found.');
      return shop;
    },
    (shop) => ({ shopId: shop.id, actorUserId: auth.user.id, action: 'shop.settings_changed', subjectType: 'Shop', subjectId: shop.id, at: clock.now() }),
  );
}
