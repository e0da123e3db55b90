import { updateMembership, type MembershipRow } from '@revloop/db';
import type { ShopRole } from '@revloop/domain/auth';
import type { AppDeps } from '../../context';
import type { AuthContext } from '../../http/auth-context';
import { writeWithAudit } from '../audit/audit.service';
import { invalidateUserSessions } from '../auth/session.service';

type ShopAuth = AuthContext & { shop: { id: string } };

/** Gives a member a new role (and dealer account); their sessions end so the new rights apply at once. */
export async function changeMemberRole({ db, clock }: AppDeps, auth: ShopAuth, row: MembershipRow, role: ShopRole, dealerId: string | null): Promise<void> {
  await writeWithAudit(
    db,
    async (trx) => {
      await updateMembership(trx, auth.shop.id, row.id, { role, dealer_id: dealerId });
      await invalidateUserSessions(trx, row.user_id, auth.shop.id);
    },
    () => ({
      shopId: auth.shop.id,
      actorUserId: auth.user.id,
      action: 'member.role_changed',
      subjectType: 'Member',
      subjectId: row.id,
      details: { from: row.role, to: role },
      at: clock.now(),
    }),
  );
}

/** Deactivates or reactivates a member, and audits it. */
export async function setMemberStatus({ db, clock }: AppDeps, auth: ShopAuth, row: MembershipRow, change: 'deactivate' | 'reactivate'): Promise<void> {
  await writeWithAudit(
    db,
    async (trx) => {
      // Deactivating ends the member's sessions in this shop at once, not at their next expiry.
      if (change === 'deactivate') await invalidateUserSessions(trx, row.user_id, auth.shop.id);
      await updateMembership(trx, auth.shop.id, row.id, { status: change === 'deactivate' ? 'deactivated' : 'active' });
    },
    () => ({ shopId: auth.shop.id, actorUserId: auth.user.id, action: `member.${change}d`, subjectType: 'Member', subjectId: row.id, at: clock.now() }),
  );
}
