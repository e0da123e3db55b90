import { Router } from 'express';
import {
  countActiveOwners,
  findDealer,
  findMembership,
  listMembers,
  type MemberListRow,
  type MembershipRow,
} from '@revloop/db';
import { changeRoleSchema, type Member } from '@revloop/contract';
import { DomainError } from '@revloop/domain';
import { asSubject, STAFF_ROLES } from '@revloop/domain/auth';
import type { AppDeps } from '../../context';
import { authorize, authorizeRow, requireShop, type AuthContext } from '../../http/auth-context';
import { parseInput } from '../../http/validate';
import { assertSeatFor } from '../billing/plan-limits.service';
import { changeMemberRole, setMemberStatus } from './members.service';

/** Owners and tuners work the bench, so they fill the plan's tuner seats. */
const takesSeat = (role: string) => role === 'owner' || role === 'tuner';

const memberRowToMember = (r: MemberListRow): Member => ({
  id: r.id,
  userId: r.user_id,
  name: r.name,
  email: r.email,
  role: r.role,
  status: r.status,
  dealer: r.dealer_id ? { id: r.dealer_id, name: r.dealer_name } : null,
  createdAt: r.created_at,
  lastSignInAt: r.last_sign_in_at,
});

export function createMembersRouter(deps: AppDeps): Router {
  const { db, clock } = deps;
  const router = Router();

  async function loadForChange(auth: AuthContext & { shop: { id: string } }, id: string): Promise<MembershipRow> {
    const row = await findMembership(db, auth.shop.id, id);
    authorizeRow(auth, 'update', 'Member', row && { shopId: row.shop_id, role: row.role });
    if (row!.user_id === auth.user.id) throw new DomainError('validation', 'You cannot change your own membership.');
    return row!;
  }

  async function assertNotLastOwner(shopId: string, row: MembershipRow) {
    if (row.role === 'owner' && row.status === 'active' && (await countActiveOwners(db, shopId)) <= 1) {
      throw new DomainError('conflict', 'A shop keeps at least one active owner.');
    }
  }

  const respond = async (shopId: string, id: string) => {
    const rows = await listMembers(db, shopId, { roles: STAFF_ROLES });
    const row = rows.find((r) => r.id === id);
    return { data: row ? memberRowToMember(row) : null };
  };

  router.get('/', async (req, res) => {
    const auth = requireShop(req);
    authorize(auth, 'read', 'Member');
    const rows = await listMembers(db, auth.shop.id, { roles: STAFF_ROLES });
    res.json({ data: rows.map(memberRowToMember), meta: { total: rows.length } });
  });

  router.patch('/:id', async (req, res) => {
    const auth = requireShop(req);
    const row = await loadForChange(auth, req.params.id);
    const input = parseInput(changeRoleSchema, req.body);
    if (!auth.ability.can('update', asSubject('Member', { shopId: auth.shop.id, role: input.role }))) {
      throw new DomainError('validation', 'Team roles are owner, tuner and dealer: a staff member cannot be made a customer, nor a customer staff.');
    }
    if (input.role !== 'owner') await assertNotLastOwner(auth.shop.id, row);
    if (takesSeat(input.role) && !takesSeat(row.role) && row.status === 'active') await assertSeatFor(db, auth.shop.id, clock.now());
    const dealerId = input.role === 'dealer' || input.role === 'customer' ? (input.dealerId ?? (input.role === 'customer' ? row.dealer_id : null)) : null;
    if (input.role === 'dealer' && !dealerId) throw new DomainError('validation', 'Choose the dealer account this user acts for.');
    if (dealerId && !(await findDealer(db, auth.shop.id, dealerId))) throw new DomainError('validation', 'That dealer is not part of this shop.');
    await changeMemberRole(deps, auth, row, input.role, dealerId);
    res.json(await respond(auth.shop.id, row.id));
  });

  for (const [path, status] of [
    ['deactivate', 'deactivated'],
    ['reactivate', 'active'],
  ] as const) {
    router.post(`/:id/${path}`, async (req, res) => {
      const auth = requireShop(req);
      const row = await loadForChange(auth, req.params.id);
      if (status === 'active' && row.status !== 'active' && takesSeat(row.role)) await assertSeatFor(db, auth.shop.id, clock.now());
      if (status === 'deactivated') await assertNotLastOwner(auth.shop.id, row);
      await setMemberStatus(deps, auth, row, path);
      res.json(await respond(auth.shop.id, row.id));
    });
  }

  return router;
}
