import { insertDealer, newId, type DealerRow } from '@revloop/db';
import type { AppDeps } from '../../context';
import type { AuthContext } from '../../http/auth-context';
import { writeWithAudit } from '../audit/audit.service';

export interface DealerInput {
  name: string;
  contactName: string;
  contactEmail: string;
  phone?: string | null;
}

/** Adds a dealer account to the shop, and audits it. */
export async function createDealer({ db, clock }: AppDeps, auth: AuthContext & { shop: { id: string } }, input: DealerInput): Promise<DealerRow> {
  return writeWithAudit(
    db,
    (trx) =>
      insertDealer(trx, {
        id: newId(),
        shop_id: auth.shop.id,
        name: input.name,
        contact_name: input.contactName,
        contact_email: input.contactEmail,
        phone: input.phone ?? null,
        created_at: clock.now().toISOString(),
      }),
    (dealer) => ({ shopId: auth.shop.id, actorUserId: auth.user.id, action: 'dealer.created', subjectType: 'Dealer', subjectId: dealer.id, at: clock.now() }),
  );
}
