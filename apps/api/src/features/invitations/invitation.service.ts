import {
  findDealer,
  findLiveInvitationByTokenHash,
  findMembershipOfUser,
  findShopById,
  findUserByEmail,
  insertInvitation,
  insertMembership,
  insertUser,
  markInvitationAccepted,
  newId,
  revokeInvitation,
  updateMembership,
  updateUser,
  type Db,
  type InvitationRow,
} from '@revloop/db';
import type { InvitationLookup } from '@revloop/contract';
import { DomainError } from '@revloop/domain';
import { parseShopSettings } from '@revloop/domain/shops';
import { ROLE_LABELS, type ShopRole } from '@revloop/domain/auth';
import type { AppDeps } from '../../context';
import { writeWithAudit } from '../audit/audit.service';
import { assertSeatFor } from '../billing/plan-limits.service';
import type { OutgoingMail } from '../mail/mailer';
import { invitationMail } from '../mail/mail-templates';
import { hashPassword, verifyPassword } from '../auth/password';
import { generateToken, hashToken } from '../auth/session.service';

export const INVITATION_TTL_MS = 7 * 86_400_000;

export interface InviteInput {
  shopId: string;
  email: string;
  role: ShopRole;
  dealerId?: string | null | undefined;
  invitedBy: { id: string; name: string } | null;
}

/** Checks and writes an invitation on `db` (the caller's transaction); returns it with the mail to send after the commit. */
export async function writeInvitation(
  db: Db,
  appOrigin: string,
  input: InviteInput,
  now: Date,
): Promise<{ invitation: InvitationRow; mail: OutgoingMail }> {
  const shop = await findShopById(db, input.shopId);
  if (!shop) throw new DomainError('not_found', 'Shop not found.');
  if (input.role === 'dealer' && !input.dealerId) {
    throw new DomainError('validation', 'Choose the dealer account this user acts for.');
  }
  if ((input.role === 'owner' || input.role === 'tuner') && input.dealerId) {
    throw new DomainError('validation', 'Only dealer users and dealer customers belong to a dealer.');
  }
  if (input.dealerId && !(await findDealer(db, input.shopId, input.dealerId))) {
    throw new DomainError('validation', 'That dealer is not part of this shop.');
  }
  const existing = await findUserByEmail(db, input.email);
  if (existing) {
    const membership = await findMembershipOfUser(db, input.shopId, existing.id);
    if (membership?.status === 'active') throw new DomainError('conflict', 'This person is already a member of the shop.');
  }
  if (input.role === 'owner' || input.role === 'tuner') await assertSeatFor(db, input.shopId, now);
  const token = generateToken();
  const expiresAt = new Date(now.getTime() + INVITATION_TTL_MS);
  const invitation = await insertInvitation(db, {
    id: newId(),
    shop_id: input.shopId,
    email: input.email.toLowerCase(),
    role: input.role,
    dealer_id: input.dealerId ?? null,
    token_hash: hashToken(token),
    invited_by_user_id: input.invitedBy?.id ?? null,
    created_at: now.toISOString(),
    expires_at: expiresAt.toISOString(),
  });
  const mail = invitationMail(invitation.email, {
    shopName: shop.name,
    roleLabel: ROLE_LABELS[input.role].toLowerCase(),
    inviterName: input.invitedBy?.name ?? null,
    url: `${appOrigin}/invitations/${token}`,
    expiresAt,
    timeZone: parseShopSettings(shop.settings).timeZone,
  });
  return { invitation, mail };
}

export async function lookupInvitation(db: Db, token: string, now: Date): Promise<{ invitation: InvitationRow; view: InvitationLookup }> {
  const invitation = await findLiveInvitationByTokenHash(db, hashToken(token), now.toISOString());
  if (!invitation) throw new DomainError('not_found', 'This invitation is invalid, used or expired. Ask for a new one.');
  const shop = await findShopById(db, invitation.shop_id);
  const dealer = invitation.dealer_id ? await findDealer(db, invitation.shop_id, invitation.dealer_id) : undefined;
  const user = await findUserByEmail(db, invitation.email);
  return {
    invitation,
    view: {
      email: invitation.email,
      role: invitation.role,
      shopName: shop?.name ?? '',
      dealerName: dealer?.name ?? null,
      expiresAt: invitation.expires_at,
      existingAccount: Boolean(user?.password_hash),
    },
  };
}

type Recorder = Pick<AppDeps, 'db' | 'clock'>;

/**
 * Accepting creates the account (or joins an existing one after its password) and the membership, all at once, and
 * records it in the shop's audit trail in the same transaction.
 */
export async function acceptInvitation(
  { db, clock }: Recorder,
  token: string,
  input: { name: string; password: string },
): Promise<{ userId: string; shopId: string; invitation: InvitationRow }> {
  const now = clock.now();
  const { invitation } = await lookupInvitation(db, token, now);
  const existing = await findUserByEmail(db, invitation.email);
  if (existing?.password_hash && !(await verifyPassword(existing.password_hash, input.password))) {
    throw new DomainError('validation', 'This e-mail already has a Revloop account: enter that account’s password.');
  }
  const passwordHash = existing?.password_hash ? null : await hashPassword(input.password);
  const at = now.toISOString();
  const userId = await writeWithAudit(
    db,
    async (trx) => {
      if (!(await markInvitationAccepted(trx, invitation.id, at))) {
        throw new DomainError('conflict', 'This invitation was just used.');
      }
      const user =
        existing ??
        (await insertUser(trx, { id: newId(), email: invitation.email, name: input.name, password_hash: passwordHash, created_at: at }));
      if (existing && passwordHash) await updateUser(trx, existing.id, { password_hash: passwordHash, name: input.name });
      const membership = await findMembershipOfUser(trx, invitation.shop_id, user.id);
      if (membership) {
        await updateMembership(trx, invitation.shop_id, membership.id, {
          role: invitation.role,
          dealer_id: invitation.dealer_id,
          status: 'active',
        });
      } else {
        await insertMembership(trx, {
          id: newId(),
          shop_id: invitation.shop_id,
          user_id: user.id,
          role: invitation.role,
          dealer_id: invitation.dealer_id,
          created_at: at,
        });
      }
      await updateUser(trx, user.id, { last_sign_in_at: at });
      return user.id;
    },
    (userId) => ({
      shopId: invitation.shop_id,
      actorUserId: userId,
      action: 'invitation.accepted',
      subjectType: 'Invitation',
      subjectId: invitation.id,
      details: { role: invitation.role },
      at: clock.now(),
    }),
  );
  return { userId, shopId: invitation.shop_id, invitation };
}

/** Sends an invitation from a member of the shop and records it. */
export async function sendInvitation(
  deps: Recorder & Pick<AppDeps, 'mailer' | 'env'>,
  invite: InviteInput & { invitedBy: { id: string } },
) {
  const { invitation, mail } = await writeWithAudit(
    deps.db,
    (trx) => writeInvitation(trx, deps.env.APP_ORIGIN, invite, deps.clock.now()),
    ({ invitation }) => ({
      shopId: invite.shopId,
      actorUserId: invite.invitedBy.id,
      action: 'invitation.sent',
      subjectType: 'Invitation',
      subjectId: invitation.id,
      details: { email: invitation.email, role: invitation.role },
      at: deps.clock.now(),
    }),
  );
  await deps.mailer.send(mail);
  return invitation;
}

/** Revokes a pending invitation (409 when it was already used or revoked) and records it. */
export async function withdrawInvitation(deps: Recorder, shopId: string, actorUserId: string, invitationId: string): Promise<void> {
  await writeWithAudit(
    deps.db,
    async (trx) => {
      if (!(await revokeInvitation(trx, shopId, invitationId, deps.clock.now().toISOString()))) {
        throw new DomainError('conflict', 'This invitation was already used or revoked.');
      }
    },
    () => ({ shopId, actorUserId, action: 'invitation.revoked', subjectType: 'Invitation', subjectId: invitationId, at: deps.clock.now() }),
  );
}
