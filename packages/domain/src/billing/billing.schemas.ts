import { z } from 'zod';
import { moneyMinorSchema } from './money';
import { PLAN_IDS } from './plans';

/** `POST /api/billing/checkout`: what the buyer is paying for; the price always comes from the server. */
export const checkoutInputSchema = z.discriminatedUnion('purpose', [
  z.object({ purpose: z.literal('subscription'), planId: z.enum(PLAN_IDS, 'Choose a plan.'), seats: z.number().int().min(1).max(100) }),
  z.object({ purpose: z.literal('payment_method') }),
  z.object({ purpose: z.literal('job'), jobId: z.string().min(1, 'Choose a job.') }),
  z.object({
    purpose: z.literal('topup'),
    dealerId: z.string().min(1, 'Choose a dealer.'),
    amountMinor: moneyMinorSchema.min(100, 'Top up at least 1.00.').max(10_000_000, 'Top up at most 100,000.00 at once.'),
  }),
]);
export type CheckoutInput = z.infer<typeof checkoutInputSchema>;

export const planChangeSchema = z.object({ planId: z.enum(PLAN_IDS, 'Choose a plan.'), seats: z.number().int().min(1).max(100) });

export const refundInputSchema = z.object({
  amountMinor: moneyMinorSchema.min(1, 'Enter an amount above zero.'),
  reason: z.string().trim().min(3, 'Give a reason of at least 3 characters.').max(500, 'Use at most 500 characters.'),
  /** Repeating a request with the same key refunds once. */
  requestId: z.string().trim().min(8).max(80),
});
export type RefundInput = z.infer<typeof refundInputSchema>;
