import { z } from 'zod';
import { itemOf, listOf, timestamp } from './envelope';
import { MEMBER_STATUSES } from './members';

/** A dealer as `POST /api/dealers` answers it. */
export const dealerSchema = z.object({
  id: z.string(),
  name: z.string(),
  contactName: z.string(),
  contactEmail: z.string(),
  phone: z.string().nullable(),
  createdAt: timestamp,
});
export type Dealer = z.infer<typeof dealerSchema>;

/** A dealer as `GET /api/dealers` lists them, with how many people each has. */
export const dealerListItemSchema = dealerSchema.extend({ userCount: z.number(), customerCount: z.number() });
export type DealerListItem = z.infer<typeof dealerListItemSchema>;
export const dealersResponseSchema = listOf(dealerListItemSchema);

export const dealerUserSchema = z.object({ id: z.string(), name: z.string(), email: z.string(), status: z.enum(MEMBER_STATUSES) });
export type DealerUser = z.infer<typeof dealerUserSchema>;

/** `GET /api/dealers/:id`: the dealer page. */
export const dealerDetailSchema = dealerSchema.extend({
  users: z.array(dealerUserSchema),
  /** Null for viewers who may not read the dealer's ledger (tuners). */
  balance: z.object({ balanceMinor: z.number(), currency: z.string() }).nullable(),
  jobs: z.object({ open: z.number(), total: z.number() }),
});
export type DealerDetail = z.infer<typeof dealerDetailSchema>;
export const dealerDetailResponseSchema = itemOf(dealerDetailSchema);
