import { SHOP_ROLES } from '@revloop/domain/auth';
import { z } from 'zod';
import { joinedRefSchema, listOf, timestamp } from './envelope';

export const MEMBER_STATUSES = ['active', 'deactivated'] as const;

/** A member of the shop as `GET /api/members` lists them. */
export const memberSchema = z.object({
  id: z.string(),
  userId: z.string(),
  name: z.string(),
  email: z.string(),
  role: z.enum(SHOP_ROLES),
  status: z.enum(MEMBER_STATUSES),
  dealer: joinedRefSchema.nullable(),
  createdAt: timestamp,
  lastSignInAt: timestamp.nullable(),
});
export type Member = z.infer<typeof memberSchema>;
export const membersResponseSchema = listOf(memberSchema);

/** Body of `PATCH /api/members/:id/role`. */
export const changeRoleSchema = z.object({ role: z.enum(SHOP_ROLES), dealerId: z.string().min(1).nullish() });
export type ChangeRoleInput = z.infer<typeof changeRoleSchema>;
