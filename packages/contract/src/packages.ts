import { PACKAGE_MODULES } from '@revloop/domain/jobs';
import { z } from 'zod';
import { itemOf, listWithMeta, timestamp } from './envelope';

/** What the shop sells; prices in integer minor units of the shop's currency. Customers never see the dealer price. */
export const packageSchema = z.object({
  id: z.string(),
  name: z.string(),
  description: z.string(),
  modules: z.array(z.enum(PACKAGE_MODULES)),
  retailPriceMinor: z.number().int(),
  dealerPriceMinor: z.number().int().nullable(),
  roundsIncluded: z.number().int(),
  active: z.boolean(),
  createdAt: timestamp,
});
export type Package = z.infer<typeof packageSchema>;
export const packageResponseSchema = itemOf(packageSchema);

/** `GET /api/packages`: the list and the currency its prices are in. */
export const packagesResponseSchema = listWithMeta(packageSchema, z.object({ total: z.number(), currency: z.string() }));
export type PackagesResponse = z.infer<typeof packagesResponseSchema>;
