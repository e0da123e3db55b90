import { insertDealer, newId, type DealerRow } from '@revloop/db';
import type { AppDeps } from '../../context';
import type { AuthContext } from '../../http/auth-context';
import { recordAudit } from '../audit/audit.service';

export interface DealerInput {
  name: string;
  contactName: string;
  contactEmail: string;
  phone?: string | null;
}

/** Adds a dealer account to the shop, and audits it. */
export async function createDealer({ db, clock }: AppDeps, auth: AuthContext & { shop: { id: string } }, input: DealerInput): Promise<DealerRow> {
  const dealer = await insertDealer(db, {
    id: newId(),
    shop_id: auth.shop.id,
    name: input.name,
    contact_name: input.contactName,
    contact_email: input.contactEmail,
    phone: input.phone ?? null,
    created_at: clock.now().toISOString(),
  });
  await recordAudit(db, { shopId: auth.shop.id, actorUserId: auth.user.id, action: 'dealer.created', subjectType: 'Dealer', subjectId: dealer.id, at: clock.now() });
  return dealer;
}
